import type { SavedSurfaceEnergy } from '@/components/data/resources';
import { fmt, fmtUtc } from '@/components/ui/format';
import { headlineTotal } from '@/lib/surface-energy/compute';
import { METHOD_LABELS } from './labels';

/** The results kept with the sample or batch, newest first, with the angles they came from. */
export function SavedResults({ saved, kind }: { saved: SavedSurfaceEnergy[]; kind: string }) {
  return (
    <section className="card" aria-label="Saved results" data-testid="saved-results">
      <h2 className="mb-2">Saved results</h2>
      {saved.length === 0 ? (
        <p className="text-sm text-ink-600">No surface energy saved with this {kind} yet.</p>
      ) : (
        <ul className="divide-y divide-ink-100 text-sm">
          {saved.map((result) => {
            const head = headlineTotal(result.outputs);
            return (
              <li key={result.id} className="py-2" data-testid="saved-result">
                <span className="font-medium">{fmtUtc(result.createdAt)}</span>
                {result.createdByName ? (
                  <span className="text-ink-600"> · {result.createdByName}</span>
                ) : null}
                <span className="text-ink-600">
                  {' '}
                  · {result.inputs.options.methods.map((m) => METHOD_LABELS[m]).join(', ')}
                </span>
                {head?.components.gammaTotal ? (
                  <span className="block font-mono">
                    {head.label}: {fmt(head.components.gammaTotal.value)} ±{' '}
                    {fmt(head.components.gammaTotal.standardUncertainty)} mN/m
                  </span>
                ) : null}
                <span className="block text-xs text-ink-600">
                  From{' '}
                  {result.inputs.liquids
                    .map((l) => `${l.name} ${fmt(l.meanDeg)}° (n = ${l.n})`)
                    .join(', ')}
                </span>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
