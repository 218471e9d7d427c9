import Link from 'next/link';
import { VerdictDetail } from '@/components/compare/comparison-view';
import { PlainTable } from '@/components/ui/plain-table';
import type { BatchLiquidResult, BatchSurfaceEnergy } from '@/lib/compare/types';
import type { ComparisonLiquidInput } from '@/lib/contracts/compare';
import { analysisMethodName } from '@/lib/contracts/drops';
import type { ReviewDropOverlay } from '@/lib/contracts/reviews';
import { DropOverlay } from './drop-overlay';
import { dropHref } from '@/lib/measure/links';

const fmt = (v: number | null | undefined, digits = 1) =>
  v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits);

export type ReviewDrop = {
  analysisId: string;
  dropId: string;
  revision: number;
  method: string;
  sampleLabel: string;
  liquidName: string;
  leftDeg: number;
  rightDeg: number;
  meanDeg: number;
  warnings: { code: string; message: string }[];
  overlay: ReviewDropOverlay;
};

/** Each reviewed drop: its photo with the analysis drawn over it, angles, warnings, a link to it. */
export function ReviewDrops({ drops }: { drops: ReviewDrop[] }) {
  const flagged = drops.filter((d) => d.warnings.length > 0).length;
  return (
    <>
      <p className="mb-3 text-sm text-ink-700" data-testid="review-drop-summary">
        {drops.length} drop{drops.length === 1 ? '' : 's'};{' '}
        {flagged === 0 ? 'no warnings.' : `${flagged} with warnings, marked below.`} Overlay: dashed
        line, baseline; rings, contact points; solid lines, tangents at the saved angles.
      </p>
      <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3" data-testid="review-drops">
        {drops.map((d) => {
          const name = `Drop of ${d.liquidName} on sample ${d.sampleLabel}`;
          return (
            <li
              key={d.analysisId}
              className={`rounded-md border p-2 ${d.warnings.length > 0 ? 'border-amber-500 bg-amber-50' : 'border-ink-200 bg-white'}`}
              data-testid="review-drop"
            >
              {d.overlay ? (
                <DropOverlay
                  overlay={d.overlay}
                  leftDeg={d.leftDeg}
                  rightDeg={d.rightDeg}
                  label={`${name}, with its baseline, contact points and tangents`}
                />
              ) : (
                <p className="rounded-md bg-ink-50 px-2 py-6 text-center text-xs text-ink-600">
                  Angles entered by hand: no photo.
                </p>
              )}
              <p className="mt-2 text-sm">
                <Link href={dropHref(d.dropId)} className="font-medium text-lagoon-700 underline">
                  {d.sampleLabel} · {d.liquidName}
                </Link>{' '}
                <span className="text-xs text-ink-600">
                  {analysisMethodName(d.method)}, revision {d.revision}
                </span>
              </p>
              <p className="font-mono text-sm tabular-nums">
                left {fmt(d.leftDeg)}°, right {fmt(d.rightDeg)}°, mean {fmt(d.meanDeg)}°
              </p>
              {d.warnings.length > 0 ? (
                <ul className="mt-1 space-y-0.5 text-xs text-amber-900" aria-label="Warnings">
                  {d.warnings.map((w) => (
                    <li key={w.code}>
                      <span aria-hidden="true">⚠ </span>
                      {w.message}
                    </li>
                  ))}
                </ul>
              ) : null}
            </li>
          );
        })}
      </ul>
    </>
  );
}

/** The batch's statistics and spec verdict per probe liquid, computed as the compare page does. */
export function ReviewBatchVerdict({
  liquids,
  surfaceEnergy,
  angleBasis,
}: {
  liquids: { liquid: ComparisonLiquidInput; result: BatchLiquidResult }[];
  surfaceEnergy: { result: BatchSurfaceEnergy; coverageFactor: number } | null;
  angleBasis: string;
}) {
  if (liquids.length === 0) {
    return <p className="text-sm text-ink-700">This batch has no drops to judge yet.</p>;
  }
  return (
    <>
      <PlainTable
        testId="review-verdicts"
        caption="The batch's statistics and spec verdicts per probe liquid"
        head={[
          'Liquid',
          { label: 'n', align: 'right' },
          { label: 'Mean (°)', align: 'right' },
          { label: 'SD (°)', align: 'right' },
          { label: '95 % CI (°)', align: 'right' },
          'Verdict',
        ]}
      >
        {liquids.map(({ liquid, result }) => {
          const d = result.description;
          return (
            <tr key={liquid.id} className="border-t border-ink-100 align-top">
              <th scope="row" className="py-2 pr-3 text-left font-medium">
                {liquid.name}
              </th>
              <td className="py-2 pr-3 text-right tabular-nums">{d?.n ?? 0}</td>
              <td className="py-2 pr-3 text-right tabular-nums">{fmt(d?.mean, 2)}</td>
              <td className="py-2 pr-3 text-right tabular-nums">{fmt(d?.sd, 2)}</td>
              <td className="whitespace-nowrap py-2 pr-3 text-right tabular-nums">
                {d?.ci ? `${fmt(d.ci.lower)} – ${fmt(d.ci.upper)}` : '—'}
              </td>
              <td className="py-2">
                <VerdictDetail
                  verdict={result.verdict}
                  noSpec="The coating has no angle spec for this liquid."
                />
              </td>
            </tr>
          );
        })}
      </PlainTable>
      {surfaceEnergy ? (
        <div className="mt-3 text-sm" data-testid="review-surface-energy">
          <p>
            Surface free energy:{' '}
            {surfaceEnergy.result.total
              ? `${fmt(surfaceEnergy.result.total.value)} ± ${fmt(surfaceEnergy.coverageFactor * surfaceEnergy.result.total.standardUncertainty)} mN/m`
              : (surfaceEnergy.result.note ?? '—')}
          </p>
          <VerdictDetail
            verdict={surfaceEnergy.result.verdict}
            noSpec="The coating has no surface-energy spec."
          />
        </div>
      ) : null}
      <p className="mt-2 text-xs text-ink-600">
        {angleBasis} Every latest result of the batch counts, submitted or not; CI: Student t, 95 %.
      </p>
    </>
  );
}
