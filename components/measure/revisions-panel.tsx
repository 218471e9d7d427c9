'use client';

import type { PhotoDrop } from '@/components/data/resources';
import { PlainTable } from '@/components/ui/plain-table';
import { analysisMethodName } from '@/lib/contracts/drops';

/** Every saved revision of the selected photo's drop, newest first. */
export function RevisionsPanel({ drop, error }: { drop: PhotoDrop | null; error: Error | null }) {
  if (error) return <p className="text-sm text-coral-700">{error.message}</p>;
  if (!drop) return null;
  return (
    <section className="card" aria-label="Saved revisions">
      <h2 className="mb-1">Saved revisions</h2>
      <p className="mb-2 text-xs text-ink-500">
        {drop.coatingCode} · {drop.lotCode} / {drop.sampleLabel}. Every save is kept.
      </p>
      <PlainTable
        head={[
          'Rev.',
          'Method',
          { label: 'Left', align: 'right' },
          { label: 'Right', align: 'right' },
        ]}
        bodyTestId="revisions"
      >
        {drop.revisions.map((r) => (
          <tr key={r.id} className="border-t border-ink-100">
            <td className="py-1">r{r.revision}</td>
            <td className="py-1 text-xs">
              {analysisMethodName(r.method)}
              {r.baseline ? ' · hand baseline' : ''}
            </td>
            <td className="py-1 text-right font-mono">{r.leftDeg.toFixed(1)}°</td>
            <td className="py-1 text-right font-mono">{r.rightDeg.toFixed(1)}°</td>
          </tr>
        ))}
      </PlainTable>
    </section>
  );
}
