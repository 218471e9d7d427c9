import { DefinitionList } from '@/components/ui/definition-list';
import { fmt } from '@/components/ui/format';
import type { MethodOutcome } from '@/lib/surface-energy/compute';
import { COMPONENT_LABELS } from './labels';

/** One method's outcome: its components with their uncertainty, or why it has none. */
export function ResultCard({ outcome }: { outcome: MethodOutcome }) {
  const title =
    outcome.method === 'neumann'
      ? `${outcome.label} — ${outcome.liquidsUsed.join(', ')}`
      : outcome.label;
  return (
    <article
      className="rounded-md border border-ink-200 p-4"
      data-testid={`result-${outcome.method}`}
      aria-label={title}
    >
      <h3 className="text-sm font-semibold text-ink-900">{title}</h3>
      {outcome.status === 'ok' ? (
        <>
          <DefinitionList
            className="mt-2 gap-x-4 text-sm sm:grid-cols-2"
            items={Object.entries(outcome.components).map(([key, c]) => ({
              term: COMPONENT_LABELS[key] ?? key,
              value: (
                <>
                  {fmt(c.value)} ± {fmt(c.standardUncertainty)}{' '}
                  <span className="text-ink-500">mN/m</span>
                </>
              ),
              testId: `${outcome.method}-${key}`,
            }))}
          />
          <p className="mt-2 text-xs text-ink-600">
            Liquids used: {outcome.liquidsUsed.join(', ')}
          </p>
          {outcome.warnings.length > 0 ? (
            <ul className="mt-2 list-disc pl-5 text-xs text-amber-900">
              {outcome.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          ) : null}
        </>
      ) : (
        <p className="mt-2 text-sm text-ink-700">
          {outcome.status === 'unavailable' ? 'Not available: ' : 'Could not be computed: '}
          {outcome.reason}
        </p>
      )}
    </article>
  );
}
