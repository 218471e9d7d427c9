import type { ReactNode } from 'react';

export type HeadCell = string | { label: ReactNode; align?: 'right'; hidden?: boolean };

/**
 * A small read-only table (the big sortable lists use DataTable): one head style, scrolls
 * sideways on narrow screens, rows given as children.
 */
export function PlainTable({
  head,
  children,
  label,
  testId,
  bodyTestId,
  caption,
  className = '',
}: {
  head: HeadCell[];
  children: ReactNode;
  /** Names the table for screen readers. */
  label?: string;
  testId?: string;
  bodyTestId?: string;
  /** Says what the table holds, for screen readers. */
  caption?: string;
  className?: string;
}) {
  return (
    <div className="overflow-x-auto">
      <table
        className={`w-full text-left text-sm ${className}`}
        aria-label={label}
        data-testid={testId}
      >
        {caption ? <caption className="sr-only">{caption}</caption> : null}
        <thead className="border-b border-ink-200 text-xs uppercase tracking-wide text-ink-500">
          <tr>
            {head.map((cell, i) => {
              const {
                label: text,
                align,
                hidden,
              } = typeof cell === 'string'
                ? { label: cell, align: undefined, hidden: false }
                : cell;
              return (
                <th
                  key={i}
                  scope="col"
                  className={`py-2 pr-3 font-medium ${align === 'right' ? 'text-right' : ''}`}
                >
                  {hidden ? <span className="sr-only">{text}</span> : text}
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody data-testid={bodyTestId}>{children}</tbody>
      </table>
    </div>
  );
}
