import {
  StatsInputError,
  capability,
  classifyWetting,
  describe,
  individualsChart,
  judgeAngles,
  oneWayAnova,
  tukeyFences,
  welchTTest,
  type SpecLimits,
} from '@/lib/stats';
import type {
  BatchLiquidResult,
  BatchTest,
  BatchVerdict,
  Comparison,
  ComparisonBatchInput,
  ComparisonInput,
  ComparisonLiquidInput,
  ComparisonSpecInput,
  DropPoint,
  LiquidComparison,
  SpecLine,
  SpecVerdict,
  TrendChart,
} from './types';
import { overall } from './outcome';
import { compareDynamic } from './dynamic';
import { compareSurfaceEnergy } from './surface-energy';
import { ageInDays, countsInWindow } from './window';

export { ageInDays, countsInWindow };

export const WATER_LIQUID_ID = 'liquid-water';
export const OUTLIER_RULE =
  "Tukey's fences (k = 1.5): a drop outside [Q1 − 1.5·IQR, Q3 + 1.5·IQR] of its batch is flagged, never removed";
export const ANGLE_BASIS =
  'Each drop counts with its mean angle, (left + right) / 2, of its latest analysis.';

/** p-value in words: three decimals, or "p < 0.001". */
export function formatP(p: number): string {
  return p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`;
}

/** Production order: oldest first, ties by lot code. */
export function productionOrder<T extends ComparisonBatchInput>(batches: readonly T[]): T[] {
  return [...batches].sort(
    (a, b) => a.producedOn.localeCompare(b.producedOn) || a.lotCode.localeCompare(b.lotCode),
  );
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/** Does a drop count for a spec with an age window? */
function countsFor(spec: ComparisonSpecInput, drop: DropPoint): boolean {
  return countsInWindow(spec.maxDaysSinceTreatment, drop.ageDays);
}

function judgeSpec(
  spec: ComparisonSpecInput,
  drops: readonly DropPoint[],
  minDrops: number,
): SpecVerdict {
  const counted = drops.filter((d) => countsFor(spec, d));
  const excluded = drops.length - counted.length;
  const verdict = judgeAngles(
    counted.map((d) => d.meanDeg),
    {
      minDeg: spec.minDeg ?? undefined,
      maxDeg: spec.maxDeg ?? undefined,
      appliesTo: spec.scope,
    },
    { minDrops },
  );
  let rule = verdict.rule;
  let reason = verdict.reason;
  if (spec.maxDaysSinceTreatment !== null) {
    rule += `; only drops measured within ${spec.maxDaysSinceTreatment} days of the sample's treatment count`;
    if (excluded > 0) {
      reason += ` ${plural(excluded, 'drop')} measured later than ${spec.maxDaysSinceTreatment} days after treatment (or on a sample without a treatment time) did not count.`;
    }
  }
  if (verdict.outcome === 'fail' && spec.scope === 'each-drop') {
    const labels = verdict.failingDrops.map((i) => {
      const d = counted[i];
      return `${d.sampleLabel} ${d.meanDeg.toFixed(1)}°`;
    });
    reason = `${verdict.failingDrops.length} of ${verdict.n} drops are outside the limits (${labels.join(', ')}).${
      excluded > 0 && spec.maxDaysSinceTreatment !== null
        ? ` ${plural(excluded, 'drop')} outside the ${spec.maxDaysSinceTreatment}-day window did not count.`
        : ''
    }`;
  }
  return { specId: spec.id, outcome: verdict.outcome, rule, reason, n: verdict.n, excluded };
}

/** The limits Cpk is judged against: the per-drop spec when there is one (limits on values). */
function capabilitySpec(specs: readonly ComparisonSpecInput[]): ComparisonSpecInput | null {
  return specs.find((s) => s.scope === 'each-drop') ?? specs[0] ?? null;
}

function batchCapability(
  specs: readonly ComparisonSpecInput[],
  drops: readonly DropPoint[],
): Pick<BatchLiquidResult, 'capability' | 'capabilityNote'> {
  const spec = capabilitySpec(specs);
  if (!spec) return { capability: null, capabilityNote: 'No spec limits for this liquid.' };
  const values = drops.filter((d) => countsFor(spec, d)).map((d) => d.meanDeg);
  const limits: SpecLimits = { lower: spec.minDeg ?? undefined, upper: spec.maxDeg ?? undefined };
  try {
    const c = capability(values, limits);
    return {
      capability: { cpk: c.cpk, rule: c.rule, sigmaMethod: c.sigmaMethod, n: c.n },
      capabilityNote: null,
    };
  } catch (error) {
    if (error instanceof StatsInputError)
      return { capability: null, capabilityNote: error.message };
    throw error;
  }
}

function markOutliers(drops: DropPoint[]): BatchLiquidResult['outliers'] {
  if (drops.length < 4) return null;
  const fences = tukeyFences(drops.map((d) => d.meanDeg));
  for (const i of fences.outlierIndices) drops[i].outlier = true;
  return {
    rule: fences.rule,
    k: fences.k,
    lowerFence: fences.lowerFence,
    upperFence: fences.upperFence,
  };
}

/**
 * "B-0413 is 6.2° lower than B-0412 (Welch t-test, p = 0.003)", or why no test was possible.
 */
export function welchSentence(a: BatchLiquidResult, b: BatchLiquidResult): BatchTest {
  const base = { batchId: a.batch.id, otherBatchId: b.batch.id };
  const va = a.drops.map((d) => d.meanDeg);
  const vb = b.drops.map((d) => d.meanDeg);
  try {
    const result = welchTTest(va, vb);
    const diff = result.difference;
    const size = Math.abs(diff).toFixed(1);
    const head =
      size === '0.0'
        ? `${a.batch.lotCode} and ${b.batch.lotCode} have the same mean`
        : `${a.batch.lotCode} is ${size}° ${diff < 0 ? 'lower' : 'higher'} than ${b.batch.lotCode}`;
    const significance =
      result.p < 0.05
        ? 'a difference at the 5 % level'
        : 'not a significant difference at the 5 % level';
    return {
      ...base,
      sentence: `${head} (Welch t-test, ${formatP(result.p)}): ${significance}.`,
      result,
    };
  } catch (error) {
    if (!(error instanceof StatsInputError)) throw error;
    return {
      ...base,
      sentence: `${a.batch.lotCode} against ${b.batch.lotCode}: no Welch t-test — ${error.message}`,
      result: null,
    };
  }
}

function anovaSummary(measured: readonly BatchLiquidResult[]): LiquidComparison['anova'] {
  if (measured.length < 2) {
    return { result: null, sentence: 'One-way ANOVA needs at least two batches with drops.' };
  }
  try {
    const result = oneWayAnova(measured.map((b) => b.drops.map((d) => d.meanDeg)));
    const f = `F(${result.dfBetween}, ${result.dfWithin}) = ${result.f.toFixed(2)}`;
    return {
      result,
      sentence:
        result.p < 0.05
          ? `The batch means differ (one-way ANOVA, ${f}, ${formatP(result.p)}); ${(result.rSquared * 100).toFixed(0)} % of the spread of the drops lies between batches.`
          : `The batch means do not differ significantly at the 5 % level (one-way ANOVA, ${f}, ${formatP(result.p)}).`,
    };
  } catch (error) {
    if (!(error instanceof StatsInputError)) throw error;
    return { result: null, sentence: `No one-way ANOVA: ${error.message}` };
  }
}

function trendChart(measured: readonly BatchLiquidResult[]): {
  trend: TrendChart | null;
  trendNote: string | null;
} {
  const means = measured.map((b) => (b.description as NonNullable<typeof b.description>).mean);
  try {
    const chart = individualsChart(means);
    return {
      trend: {
        method: chart.method,
        centreLine: chart.centreLine,
        ucl: chart.ucl,
        lcl: chart.lcl,
        points: measured.map((b, i) => ({
          batchId: b.batch.id,
          lotCode: b.batch.lotCode,
          producedOn: b.batch.producedOn,
          mean: means[i],
          outsideLimits: chart.points[i].outsideLimits,
        })),
      },
      trendNote: null,
    };
  } catch (error) {
    if (!(error instanceof StatsInputError)) throw error;
    return { trend: null, trendNote: error.message };
  }
}

function specLines(specs: readonly ComparisonSpecInput[]): SpecLine[] {
  const lines: SpecLine[] = [];
  for (const s of specs) {
    const who = s.scope === 'each-drop' ? 'each drop' : 'mean';
    const window = s.maxDaysSinceTreatment !== null ? `, ≤ ${s.maxDaysSinceTreatment} d` : '';
    if (s.minDeg !== null)
      lines.push({
        specId: s.id,
        value: s.minDeg,
        kind: 'min',
        scope: s.scope,
        label: `${who} ≥ ${s.minDeg}°${window}`,
      });
    if (s.maxDeg !== null)
      lines.push({
        specId: s.id,
        value: s.maxDeg,
        kind: 'max',
        scope: s.scope,
        label: `${who} ≤ ${s.maxDeg}°${window}`,
      });
  }
  return lines;
}

/**
 * Builds the batch comparison from the drops' latest analyses: per probe liquid and batch the
 * description (Student t CI), the verdict against each angle spec, the hydrophobicity class,
 * Cpk and Tukey outliers; Welch t-tests against the previous and the reference batch; one-way
 * ANOVA across batches; an individuals control chart over the batch means in production order.
 * Pure: no database, no clock.
 */
export function buildComparison(input: ComparisonInput): Comparison {
  const minDrops = input.minDrops ?? 3;
  const waterId = input.waterLiquidId ?? WATER_LIQUID_ID;
  const batches = productionOrder(input.batches);
  const batchIds = new Set(batches.map((b) => b.id));
  const referenceBatch = batches.find((b) => b.id === input.referenceBatchId) ?? null;

  const liquidIds = new Set<string>();
  for (const d of input.drops) if (batchIds.has(d.batchId)) liquidIds.add(d.probeLiquidId);
  for (const s of input.specs) liquidIds.add(s.probeLiquidId);
  // Water first (the hydrophobicity question), then by name.
  const liquids = input.liquids
    .filter((l) => liquidIds.has(l.id))
    .sort((a, b) => (a.id === waterId ? -1 : b.id === waterId ? 1 : a.name.localeCompare(b.name)));

  // One pass over the drops: group them by batch and liquid, and work out their age once.
  const groups = new Map<string, DropPoint[]>();
  const key = (batchId: string, liquidId: string) => `${batchId}\u0000${liquidId}`;
  for (const d of input.drops) {
    if (!batchIds.has(d.batchId)) continue;
    const k = key(d.batchId, d.probeLiquidId);
    let group = groups.get(k);
    if (!group) groups.set(k, (group = []));
    group.push({
      ...d,
      ageDays: ageInDays(d.measuredAt, d.treatedAt),
      outlier: false,
      outsideAgeWindow: false,
    });
  }

  const compare = (
    liquid: ComparisonLiquidInput,
    specs: ComparisonSpecInput[],
    dropsOf: (batchId: string) => DropPoint[],
    withWettingClass: boolean,
  ): LiquidComparison => {
    const results = batches.map((batch): BatchLiquidResult => {
      const drops = dropsOf(batch.id);
      for (const d of drops) d.outsideAgeWindow = specs.some((s) => !countsFor(s, d));
      const outliers = markOutliers(drops);
      const values = drops.map((d) => d.meanDeg);
      const description = values.length > 0 ? describe(values) : null;
      const verdicts = specs.map((s) => judgeSpec(s, drops, minDrops));
      return {
        batch,
        drops,
        description,
        wettingClass: withWettingClass && description ? classifyWetting(description.mean) : null,
        verdict: { outcome: overall(verdicts), specs: verdicts },
        ...batchCapability(specs, drops),
        outliers,
      };
    });
    const measured = results.filter((r) => r.drops.length > 0);
    const vsPrevious = measured.slice(1).map((r, i) => welchSentence(r, measured[i]));
    const reference = referenceBatch
      ? measured.find((r) => r.batch.id === referenceBatch.id)
      : undefined;
    const vsReference = reference
      ? measured.filter((r) => r !== reference).map((r) => welchSentence(r, reference))
      : [];
    return {
      liquid,
      specs,
      specLines: specLines(specs),
      batches: results,
      vsPrevious,
      vsReference,
      anova: anovaSummary(measured),
      ...trendChart(measured),
    };
  };

  const liquidResults = liquids.map((liquid) =>
    compare(
      liquid,
      input.specs.filter(
        (s) => s.probeLiquidId === liquid.id && (s.minDeg !== null || s.maxDeg !== null),
      ),
      (batchId) => groups.get(key(batchId, liquid.id)) ?? [],
      liquid.id === waterId,
    ),
  );

  const dropsOfBatch = (batchId: string) =>
    liquids.flatMap((l) => groups.get(key(batchId, l.id)) ?? []);
  return {
    batches,
    referenceBatch,
    liquids: liquidResults,
    dynamic: compareDynamic(input, batchIds, (liquid, specs, dropsOf) =>
      compare(liquid, specs, dropsOf, false),
    ),
    surfaceEnergy: compareSurfaceEnergy(batches, liquids, input.specs, dropsOfBatch, minDrops),
    angleBasis: ANGLE_BASIS,
    outlierRule: OUTLIER_RULE,
  };
}

/** What the surface-energy verdict is listed under beside the liquids. */
export const SURFACE_ENERGY_LABEL = 'Surface free energy';

/** Each batch's verdicts: one per liquid, and the surface-energy one when there is a limit. */
function batchVerdicts(
  comparison: Comparison,
): { batch: ComparisonBatchInput; label: string; verdict: BatchVerdict }[] {
  return [
    ...comparison.liquids.flatMap((liquid) =>
      liquid.batches.map((r) => ({
        batch: r.batch,
        label: liquid.liquid.name,
        verdict: r.verdict,
      })),
    ),
    ...comparison.dynamic.flatMap((quantity) =>
      quantity.batches.map((r) => ({ batch: r.batch, label: quantity.title, verdict: r.verdict })),
    ),
    ...(comparison.surfaceEnergy?.batches ?? []).map((r) => ({
      batch: r.batch,
      label: SURFACE_ENERGY_LABEL,
      verdict: r.verdict,
    })),
  ];
}

/** Every verdict outcome of the comparison (per liquid and batch, and surface energy). */
export function verdictOutcomes(comparison: Comparison): BatchVerdict['outcome'][] {
  return batchVerdicts(comparison).map((v) => v.verdict.outcome);
}

/** Batches whose verdict is 'fail' for any liquid or for surface energy (the dashboard's "out of spec"). */
export function batchesOutOfSpec(
  comparison: Comparison,
): { batch: ComparisonBatchInput; liquidName: string; rule: string; reason: string }[] {
  return batchVerdicts(comparison)
    .filter((v) => v.verdict.outcome === 'fail')
    .map(({ batch, label, verdict }) => {
      const failed = verdict.specs.filter((s) => s.outcome === 'fail');
      return {
        batch,
        liquidName: label,
        rule: failed.map((s) => s.rule).join('; '),
        reason: failed.map((s) => s.reason).join(' '),
      };
    });
}
