'use client';

import { DefinitionList, type Definition } from '@/components/ui/definition-list';
import type { AnalysisResult } from '@/lib/analysis/types';

const fmt = (value: number | null | undefined, digits = 1) =>
  value === null || value === undefined || !Number.isFinite(value) ? '—' : value.toFixed(digits);

/** Left, right and mean angle with uncertainty, the drop's size and the quality warnings. */
export function ResultsPanel({
  result,
  status,
  error,
}: {
  result: AnalysisResult | null;
  /** null: no photo is shown. */
  status: string | null;
  error: string | null;
}) {
  if (error) {
    return (
      <section className="card" aria-label="Result">
        <h2 className="mb-2">Result</h2>
        <p role="alert" className="text-sm text-coral-700">
          {error}
        </p>
      </section>
    );
  }
  if (!result) {
    return (
      <section className="card" aria-label="Result">
        <h2 className="mb-2">Result</h2>
        <p className="text-sm text-ink-600">
          {status === null
            ? 'No photo shown: upload photos or choose one in the table.'
            : status === 'analysing' || status === 'loading'
              ? 'Analysing…'
              : 'No result yet.'}
        </p>
      </section>
    );
  }
  const volume =
    result.volumeUl !== null
      ? `${fmt(result.volumeUl, 2)} µL`
      : result.volumePx3 !== null
        ? `${fmt(result.volumePx3 / 1e6, 2)} ×10⁶ px³`
        : '—';
  const rows: Definition[] = [
    { term: 'Base diameter', value: `${fmt(result.baseDiameterPx)} px` },
    { term: 'Height', value: `${fmt(result.heightPx)} px` },
    {
      term: 'Apex radius',
      value: result.apexRadiusPx === null ? '—' : `${fmt(result.apexRadiusPx)} px`,
    },
    { term: 'Volume', value: volume },
    { term: 'Bond number β', value: result.bond === null ? '—' : fmt(result.bond, 3) },
    { term: 'RMS residual', value: `${fmt(result.rmsResidualPx, 2)} px` },
    { term: 'Edge points', value: String(result.edgePointCount) },
    {
      term: 'Baseline',
      value: result.baselineSource === 'given' ? 'adjusted by hand' : 'found automatically',
    },
  ];
  return (
    <section className="card" aria-label="Result" data-testid="results-panel">
      <h2 className="mb-3">Result</h2>
      <dl className="grid grid-cols-3 gap-2 text-center">
        {(
          [
            ['Left', result.leftDeg, result.leftUncertaintyDeg],
            ['Mean', result.meanDeg, (result.leftUncertaintyDeg + result.rightUncertaintyDeg) / 2],
            ['Right', result.rightDeg, result.rightUncertaintyDeg],
          ] as const
        ).map(([label, value, u]) => (
          <div
            key={label}
            className={`rounded-md px-2 py-2 ${label === 'Mean' ? 'bg-lagoon-50' : 'bg-ink-50'}`}
          >
            <dt className="text-xs uppercase tracking-wide text-ink-500">{label}</dt>
            <dd
              className="font-mono text-xl text-ink-950"
              data-testid={`angle-${label.toLowerCase()}`}
            >
              {fmt(value, 1)}°
            </dd>
            <dd className="font-mono text-xs text-ink-600">± {fmt(u, 1)}°</dd>
          </div>
        ))}
      </dl>
      <p className="mt-2 text-xs text-ink-500">
        Uncertainty: ±1 px baseline shift (L {fmt(result.uncertaintyParts.baselineShiftDeg.left, 2)}
        °, R {fmt(result.uncertaintyParts.baselineShiftDeg.right, 2)}°) and the fit&apos;s standard
        error (L {fmt(result.uncertaintyParts.fitStandardErrorDeg.left, 2)}°, R{' '}
        {fmt(result.uncertaintyParts.fitStandardErrorDeg.right, 2)}°), combined in quadrature.
      </p>
      <DefinitionList items={rows} className="mt-3 text-sm" />
      {result.warnings.length > 0 ? (
        <ul className="mt-3 space-y-1" aria-label="Warnings">
          {result.warnings.map((warning) => (
            <li
              key={warning.code}
              className="rounded-md bg-amber-50 px-2 py-1 text-sm text-amber-900"
              data-code={warning.code}
            >
              {warning.message}
            </li>
          ))}
        </ul>
      ) : (
        <p className="mt-3 text-sm text-leaf-700">No quality warnings.</p>
      )}
    </section>
  );
}
