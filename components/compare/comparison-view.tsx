import type {
  BatchLiquidResult,
  BatchVerdict,
  Comparison,
  LiquidComparison,
  SpecVerdict,
  SurfaceEnergyComparison,
} from '@/lib/compare/types';
import { PlainTable } from '@/components/ui/plain-table';
import { StripPlot, type StripBatch } from './strip-plot';
import { TrendChart } from './trend-chart';
import Link from 'next/link';
import { dropHref } from '@/lib/measure/links';

const fmt = (v: number | null | undefined, digits = 1) =>
  v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits);

const VERDICT_STYLE: Record<BatchVerdict['outcome'], { label: string; className: string }> = {
  pass: { label: 'Pass', className: 'bg-leaf-100 text-leaf-900 border-leaf-500' },
  fail: { label: 'Fail', className: 'bg-coral-100 text-coral-900 border-coral-500' },
  'not-enough-data': {
    label: 'Not enough data',
    className: 'bg-amber-100 text-amber-900 border-amber-500',
  },
  'no-spec': { label: 'No spec', className: 'bg-ink-100 text-ink-800 border-ink-300' },
};

export function VerdictBadge({ outcome }: { outcome: BatchVerdict['outcome'] }) {
  const style = VERDICT_STYLE[outcome];
  return (
    <span
      className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold ${style.className}`}
    >
      {style.label}
    </span>
  );
}

export function VerdictDetail({ verdict, noSpec }: { verdict: BatchVerdict; noSpec: string }) {
  return (
    <>
      <VerdictBadge outcome={verdict.outcome} />
      {verdict.specs.length === 0 ? (
        <p className="mt-1 text-xs text-ink-600">{noSpec}</p>
      ) : (
        <ul className="mt-1 space-y-1 text-xs text-ink-700">
          {verdict.specs.map((s: SpecVerdict) => (
            <li key={s.specId}>
              <span className="font-medium">{VERDICT_STYLE[s.outcome].label}:</span>{' '}
              <span data-testid="rule">Rule: {s.rule}.</span> {s.reason}
            </li>
          ))}
        </ul>
      )}
    </>
  );
}

function stripBatches(liquid: LiquidComparison): StripBatch[] {
  return liquid.batches.map((r) => ({
    lotCode: r.batch.lotCode,
    drops: r.drops.map((d) => ({
      value: d.meanDeg,
      sample: d.sampleLabel,
      outlier: d.outlier,
      outsideAgeWindow: d.outsideAgeWindow,
      ageDays: d.ageDays,
    })),
    mean: r.description?.mean ?? null,
    ciLower: r.description?.ci?.lower ?? null,
    ciUpper: r.description?.ci?.upper ?? null,
  }));
}

function BatchRow({ r, liquidId }: { r: BatchLiquidResult; liquidId: string }) {
  const d = r.description;
  const outliers = r.drops.filter((x) => x.outlier).length;
  return (
    <tr
      className="border-t border-ink-100 align-top"
      data-testid={`batch-row-${liquidId}-${r.batch.lotCode}`}
    >
      <th scope="row" className="py-2 pr-3 text-left font-normal">
        <span className="font-mono font-medium">{r.batch.lotCode}</span>
        <span className="block text-xs text-ink-500">{r.batch.producedOn}</span>
        <a
          href={`/api/batches/${r.batch.id}/report`}
          className="block text-xs text-lagoon-700 underline print:hidden"
        >
          Certificate (PDF)
        </a>
      </th>
      <td className="py-2 pr-3 text-right tabular-nums" data-testid="n">
        {d?.n ?? 0}
      </td>
      <td className="py-2 pr-3 text-right tabular-nums" data-testid="mean">
        {fmt(d?.mean, 2)}
      </td>
      <td className="py-2 pr-3 text-right tabular-nums">{fmt(d?.sd, 2)}</td>
      <td className="py-2 pr-3 text-right tabular-nums whitespace-nowrap">
        {d?.ci ? `${fmt(d.ci.lower)} – ${fmt(d.ci.upper)}` : '—'}
      </td>
      <td className="py-2 pr-3 text-sm">{r.wettingClass ? r.wettingClass.label : '—'}</td>
      <td className="py-2 pr-3" data-testid={`verdict-${liquidId}-${r.batch.lotCode}`}>
        <VerdictDetail
          verdict={r.verdict}
          noSpec="The coating has no angle spec for this liquid."
        />
      </td>
      <td
        className="py-2 pr-3 text-right tabular-nums"
        title={r.capability?.rule ?? r.capabilityNote ?? ''}
      >
        {r.capability ? fmt(r.capability.cpk, 2) : '—'}
      </td>
      <td className="py-2 text-right tabular-nums">
        {outliers ? (
          <>
            {outliers}
            <ul className="text-xs">
              {r.drops
                .filter((x) => x.outlier)
                .map((x) => (
                  <li key={x.dropId}>
                    <Link
                      href={dropHref(x.dropId)}
                      className="inline-block py-1 text-lagoon-700 underline"
                    >
                      {x.sampleLabel} {fmt(x.meanDeg, 1)}°
                    </Link>
                  </li>
                ))}
            </ul>
          </>
        ) : (
          '—'
        )}
      </td>
    </tr>
  );
}

function LiquidSection({
  liquid,
  referenceLot,
}: {
  liquid: LiquidComparison;
  referenceLot: string | null;
}) {
  const measured = liquid.batches.filter((r) => r.drops.length > 0);
  const id = liquid.liquid.id;
  const capabilityRule = liquid.batches.find((r) => r.capability)?.capability;
  return (
    <section className="card compare-section mb-6" aria-labelledby={`liquid-${id}`}>
      <h2 id={`liquid-${id}`}>{liquid.liquid.name}</h2>
      {liquid.specs.length > 0 ? (
        <p className="mt-1 text-sm text-ink-600">
          Spec: {liquid.specLines.map((l) => l.label).join('; ')}
          {liquid.specs.some((s) => s.note)
            ? ` — ${liquid.specs
                .map((s) => s.note)
                .filter(Boolean)
                .join(' ')}`
            : ''}
        </p>
      ) : (
        <p className="mt-1 text-sm text-ink-600">
          The coating has no angle spec for {liquid.liquid.name.toLowerCase()}.
        </p>
      )}

      {measured.length === 0 ? (
        <p className="mt-4 text-sm text-ink-700">
          No drops of this liquid in the chosen batches yet.
        </p>
      ) : (
        <>
          <div className="mt-4">
            <StripPlot
              liquidName={liquid.liquid.name}
              batches={stripBatches(liquid)}
              specLines={liquid.specLines}
              testId={`strip-plot-${id}`}
            />
          </div>

          <div className="mt-4">
            <PlainTable
              className="min-w-[52rem]"
              caption={`${liquid.liquid.name}: batches, statistics and verdicts`}
              head={[
                'Batch',
                { label: 'n', align: 'right' },
                { label: 'Mean (°)', align: 'right' },
                { label: 'SD (°)', align: 'right' },
                { label: '95 % CI (°)', align: 'right' },
                'Class',
                'Verdict',
                { label: 'Cpk', align: 'right' },
                { label: 'Outliers', align: 'right' },
              ]}
            >
              {liquid.batches.map((r) => (
                <BatchRow key={r.batch.id} r={r} liquidId={id} />
              ))}
            </PlainTable>
          </div>
          <p className="mt-2 text-xs text-ink-600">
            CI: Student t interval of the mean. Class: water only, from the batch mean by
            common-practice thresholds (below 90° hydrophilic, above 90° hydrophobic). Cpk:{' '}
            {capabilityRule
              ? `${capabilityRule.rule}, σ ${capabilityRule.sigmaMethod}`
              : 'needs spec limits and at least two drops with some spread'}
            . Outliers: drops flagged by Tukey&apos;s fences (k = 1.5) within their batch, kept in
            every statistic.
          </p>

          <h3 className="mt-5 text-base font-semibold">Batch against batch</h3>
          {liquid.vsPrevious.length === 0 ? (
            <p className="mt-1 text-sm text-ink-700">
              Only one batch has drops; there is nothing to test it against.
            </p>
          ) : (
            <div className="mt-1 grid gap-3 md:grid-cols-2" data-testid={`tests-${id}`}>
              <div>
                <h4 className="text-sm font-medium text-ink-800">
                  Against the batch produced before
                </h4>
                <ul className="mt-1 list-disc space-y-1 pl-5 text-sm">
                  {liquid.vsPrevious.map((t) => (
                    <li key={t.batchId}>{t.sentence}</li>
                  ))}
                </ul>
              </div>
              <div>
                <h4 className="text-sm font-medium text-ink-800">
                  Against the reference batch{referenceLot ? ` ${referenceLot}` : ''}
                </h4>
                {liquid.vsReference.length > 0 ? (
                  <ul className="mt-1 list-disc space-y-1 pl-5 text-sm">
                    {liquid.vsReference.map((t) => (
                      <li key={t.batchId}>{t.sentence}</li>
                    ))}
                  </ul>
                ) : (
                  <p className="mt-1 text-sm text-ink-700">
                    {referenceLot
                      ? `The reference batch ${referenceLot} has no drops of this liquid.`
                      : 'No reference batch chosen. Pick one (e.g. the last good batch) above to test every batch against it.'}
                  </p>
                )}
              </div>
            </div>
          )}
          <p className="mt-3 text-sm" data-testid={`anova-${id}`}>
            <span className="font-medium">Across all batches:</span> {liquid.anova.sentence}
          </p>

          <h3 className="mt-5 text-base font-semibold">Trend of the batch means</h3>
          {liquid.trend ? (
            <>
              <TrendChart
                liquidName={liquid.liquid.name}
                points={liquid.trend.points}
                centreLine={liquid.trend.centreLine}
                ucl={liquid.trend.ucl}
                lcl={liquid.trend.lcl}
                specLines={liquid.specLines.filter((l) => l.scope === 'mean')}
                testId={`trend-chart-${id}`}
              />
              <p className="mt-1 text-xs text-ink-600">
                {liquid.trend.method}, over the batch means in production order.{' '}
                {liquid.trend.points.some((p) => p.outsideLimits)
                  ? `Outside the control limits: ${liquid.trend.points
                      .filter((p) => p.outsideLimits)
                      .map((p) => p.lotCode)
                      .join(', ')}.`
                  : 'No batch mean lies outside the control limits.'}{' '}
                Control limits describe the process, not the spec.
              </p>
            </>
          ) : (
            <p className="mt-1 text-sm text-ink-700">No control chart: {liquid.trendNote}</p>
          )}
        </>
      )}
    </section>
  );
}

function SurfaceEnergySection({ se }: { se: SurfaceEnergyComparison }) {
  const k = se.coverageFactor;
  const pm = (v: { value: number; standardUncertainty: number } | null) =>
    v ? `${fmt(v.value)} ± ${fmt(k * v.standardUncertainty)}` : '—';
  return (
    <section
      className="card compare-section mb-6"
      aria-labelledby="surface-energy-heading"
      data-testid="surface-energy-section"
    >
      <h2 id="surface-energy-heading">Surface free energy</h2>
      <p className="mt-1 text-sm text-ink-600">
        {se.specs.length > 0
          ? `Spec: ${se.limitLabels.join('; ')}`
          : 'The coating has no surface-energy limit; the values are shown for information.'}
        {se.windowDays !== null
          ? ` — values from drops measured within ${se.windowDays} days of treatment.`
          : ''}
      </p>
      <div className="mt-4">
        <PlainTable
          className="min-w-[48rem]"
          caption="Surface free energy of each batch and its verdict"
          head={[
            'Batch',
            'Liquids (n, mean angle)',
            { label: 'Total ± U (mN/m)', align: 'right' },
            { label: 'Dispersive ± U', align: 'right' },
            { label: 'Polar ± U', align: 'right' },
            'Verdict',
          ]}
        >
          {se.batches.map((r) => (
            <tr
              key={r.batch.id}
              className="border-t border-ink-100 align-top"
              data-testid={`surface-energy-row-${r.batch.lotCode}`}
            >
              <th scope="row" className="py-2 pr-3 text-left font-normal">
                <span className="font-mono font-medium">{r.batch.lotCode}</span>
                <a
                  href={`/surface-energy?batch=${encodeURIComponent(r.batch.id)}`}
                  className="block text-xs text-lagoon-700 underline print:hidden"
                >
                  Other methods
                </a>
              </th>
              <td className="py-2 pr-3 text-xs">
                {r.liquids.length === 0
                  ? '—'
                  : r.liquids.map((l) => (
                      <span key={l.id} className="block whitespace-nowrap">
                        {l.name}: n = {l.n}, {fmt(l.meanDeg)}°
                      </span>
                    ))}
              </td>
              <td
                className="py-2 pr-3 text-right tabular-nums whitespace-nowrap"
                data-testid="surface-energy-total"
              >
                {r.total ? pm(r.total) : <span className="text-xs text-ink-600">{r.note}</span>}
              </td>
              <td className="py-2 pr-3 text-right tabular-nums whitespace-nowrap">
                {pm(r.dispersive)}
              </td>
              <td className="py-2 pr-3 text-right tabular-nums whitespace-nowrap">{pm(r.polar)}</td>
              <td className="py-2" data-testid={`verdict-surface-energy-${r.batch.lotCode}`}>
                <VerdictDetail
                  verdict={r.verdict}
                  noSpec="The coating has no surface-energy limit."
                />
              </td>
            </tr>
          ))}
        </PlainTable>
      </div>
      <p className="mt-2 text-xs text-ink-600">
        {se.method}. {se.basis} The surface-energy page shows one standard uncertainty instead. The
        verdict is on the value itself; a limit within its uncertainty makes the verdict marginal,
        and the reason says so.
      </p>
    </section>
  );
}

export function ComparisonView({ comparison }: { comparison: Comparison }) {
  return (
    <div className="compare-results">
      <p className="mb-4 text-xs text-ink-600">
        {comparison.angleBasis} A verdict needs at least 3 drops; with fewer it says so instead of
        passing or failing.
      </p>
      {comparison.liquids.map((liquid) => (
        <LiquidSection
          key={liquid.liquid.id}
          liquid={liquid}
          referenceLot={comparison.referenceBatch?.lotCode ?? null}
        />
      ))}
      {comparison.dynamic.map((q) => (
        // A dynamic quantity reads like a liquid of its own: each series counts as one drop.
        <LiquidSection
          key={`${q.liquid.id}-${q.quantity}`}
          liquid={{
            ...q,
            liquid: { ...q.liquid, id: `${q.liquid.id}-${q.quantity}`, name: q.title },
          }}
          referenceLot={comparison.referenceBatch?.lotCode ?? null}
        />
      ))}
      {comparison.surfaceEnergy ? <SurfaceEnergySection se={comparison.surfaceEnergy} /> : null}
    </div>
  );
}
