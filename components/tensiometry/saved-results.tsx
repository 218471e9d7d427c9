import type { SavedTensiometry } from '@/components/data/resources';
import { fmt } from '@/components/ui/format';
import { FLAG_TEXT } from './labels';

const KIND_LABELS: Record<string, string> = {
  'wilhelmy-tension': 'Wilhelmy, surface tension',
  'wilhelmy-angle': 'Wilhelmy, contact angle',
  'water-check': 'Water check',
  'pendant-drop': 'Pendant drop',
};

/** A saved result in one line: the figure that matters for its kind. */
export function summary(r: SavedTensiometry): string {
  const o: Record<string, unknown> = { ...r.outputs };
  if (r.kind === 'water-check')
    return `${fmt(Number(o.measuredMilliNewtonPerM), 2)} vs ${fmt(Number(o.referenceMilliNewtonPerM), 2)} mN/m — ${FLAG_TEXT[o.flag as keyof typeof FLAG_TEXT]?.label ?? String(o.flag)}`;
  if (r.kind === 'wilhelmy-angle') return `θ = ${fmt(Number(o.contactAngleDeg), 1)}°`;
  if (r.kind === 'wilhelmy-tension' || r.kind === 'pendant-drop')
    return `γ = ${fmt(Number(o.surfaceTensionMilliNewtonPerM), 2)} mN/m`;
  return '';
}

/** Saved tensiometry results, newest first; a pendant-drop result shows its photo to readers. */
export function SavedResults({
  results,
  canReadPhotos,
}: {
  results: SavedTensiometry[];
  canReadPhotos: boolean;
}) {
  return (
    <section className="card" aria-label="Saved tensiometry results">
      <h2 className="mb-2">Saved results</h2>
      {results.length === 0 ? (
        <p className="text-sm text-ink-600">No tensiometry results saved yet.</p>
      ) : (
        <ul className="divide-y divide-ink-100 text-sm">
          {results.map((r) => (
            <li key={r.id} className="flex items-start gap-3 py-2" data-testid="saved-result">
              {r.photoId && canReadPhotos ? (
                <a
                  href={`/api/photos/${r.photoId}/image`}
                  target="_blank"
                  rel="noreferrer"
                  className="shrink-0"
                  title="Open the photo this result was fitted from"
                >
                  {/* eslint-disable-next-line @next/next/no-img-element -- authenticated thumbnail from our own route */}
                  <img
                    src={`/api/photos/${r.photoId}/thumbnail`}
                    alt="Photo of the hanging drop"
                    className="h-16 w-16 rounded border border-ink-200 object-contain"
                  />
                </a>
              ) : null}
              <div className="min-w-0">
                <span className="font-medium">{KIND_LABELS[r.kind] ?? r.kind}</span>
                <span className="font-mono"> · {summary(r)}</span>
                <span className="block text-xs text-ink-600">
                  {new Date(r.createdAt).toISOString().slice(0, 16).replace('T', ' ')} UTC
                  {r.createdByName ? ` · ${r.createdByName}` : ''}
                  {r.photoId && !canReadPhotos ? ' · fitted from a photo' : ''}
                </span>
              </div>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
