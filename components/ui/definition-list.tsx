import type { ReactNode } from 'react';

export type Definition = { term: ReactNode; value: ReactNode; testId?: string };

/**
 * Labelled values. `rows`: one per line, the value to the right in figures (results);
 * `columns`: terms in a column beside their values (a record's details).
 */
export function DefinitionList({
  items,
  variant = 'rows',
  className = '',
  testId,
}: {
  items: Definition[];
  variant?: 'rows' | 'columns';
  className?: string;
  testId?: string;
}) {
  if (variant === 'columns')
    return (
      <dl className={`grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 ${className}`} data-testid={testId}>
        {items.map((item, i) => (
          <div key={i} className="contents">
            <dt className="text-ink-600">{item.term}</dt>
            <dd data-testid={item.testId}>{item.value}</dd>
          </div>
        ))}
      </dl>
    );
  return (
    <dl className={`grid gap-1 ${className}`} data-testid={testId}>
      {items.map((item, i) => (
        <div key={i} className="flex justify-between gap-2">
          <dt className="text-ink-600">{item.term}</dt>
          <dd className="text-right font-mono text-ink-900" data-testid={item.testId}>
            {item.value}
          </dd>
        </div>
      ))}
    </dl>
  );
}
