import { describe, expect, it } from 'vitest';
import { buildComparison, batchesOutOfSpec, formatP, welchSentence } from '@/lib/compare';
import type {
  ComparisonBatchInput,
  ComparisonDropInput,
  ComparisonSpecInput,
} from '@/lib/compare';

const WATER = { id: 'liquid-water', name: 'Water' };
const DIM = { id: 'liquid-diiodomethane', name: 'Diiodomethane' };

const batch = (id: string, producedOn: string): ComparisonBatchInput => ({
  id,
  lotCode: id,
  producedOn,
});

let seq = 0;
function drops(
  batchId: string,
  angles: number[],
  options: { liquid?: string; ageDays?: number[]; sample?: string } = {},
): ComparisonDropInput[] {
  const treatedAt = '2026-11-02T08:00:00.000Z';
  return angles.map((a, i) => {
    const age = options.ageDays?.[i];
    const measured = new Date(Date.parse(treatedAt) + (age ?? 2) * 86_400_000).toISOString();
    return {
      dropId: `d${++seq}`,
      batchId,
      sampleId: `${batchId}-s`,
      sampleLabel: options.sample ?? 'P1',
      probeLiquidId: options.liquid ?? WATER.id,
      measuredAt: measured,
      treatedAt: options.ageDays ? treatedAt : null,
      leftDeg: a - 0.5,
      rightDeg: a + 0.5,
      meanDeg: a,
    };
  });
}

const eachDrop = (minDeg: number): ComparisonSpecInput => ({
  id: 'spec-each',
  probeLiquidId: WATER.id,
  minDeg,
  maxDeg: null,
  scope: 'each-drop',
  maxDaysSinceTreatment: null,
  note: '',
});
const meanSpec = (minDeg: number): ComparisonSpecInput => ({
  ...eachDrop(minDeg),
  id: 'spec-mean',
  scope: 'mean',
});

/** Two-sided p of Student t with 4 df from its closed-form CDF (e.g. Abramowitz & Stegun 26.7.3). */
function pStudent4(t: number): number {
  const x = Math.abs(t);
  const u = x / Math.sqrt(4 + x * x);
  const cdf = 0.5 + 0.5 * u * (1.5 - 0.5 * u * u);
  return 2 * (1 - cdf);
}

describe('buildComparison', () => {
  const A = batch('B-A', '2026-10-01');
  const B = batch('B-B', '2026-10-08');
  const input = {
    // Given newest first: the comparison puts them in production order.
    batches: [B, A],
    liquids: [WATER],
    specs: [eachDrop(100), meanSpec(105)],
    drops: [...drops('B-A', [110, 112, 114]), ...drops('B-B', [100, 102, 104])],
  };
  const comparison = buildComparison(input);
  const water = comparison.liquids[0];
  const [ra, rb] = water.batches;

  it('orders batches by production date', () => {
    expect(comparison.batches.map((b) => b.id)).toEqual(['B-A', 'B-B']);
  });

  it('describes each batch with a Student t 95 % interval', () => {
    // Hand check: mean 102, SD 2, SE 2/√3; t(0.975, 2) = 4.302653 (Student t table).
    expect(rb.description?.mean).toBeCloseTo(102, 10);
    expect(rb.description?.sd).toBeCloseTo(2, 10);
    expect(rb.description?.standardError).toBeCloseTo(2 / Math.sqrt(3), 10);
    expect(rb.description?.ci?.halfWidth).toBeCloseTo(4.302653 * (2 / Math.sqrt(3)), 4);
  });

  it('judges each-drop and mean specs and says which rule it applied', () => {
    expect(ra.verdict.outcome).toBe('pass');
    expect(rb.verdict.outcome).toBe('fail');
    const [each, mean] = rb.verdict.specs;
    expect(each.outcome).toBe('pass'); // every drop ≥ 100°
    expect(each.rule).toBe('each drop ≥ 100°, at least 3 drops');
    expect(mean.outcome).toBe('fail'); // mean 102° < 105°
    expect(mean.rule).toBe('mean of the drops ≥ 105°, at least 3 drops');
    expect(mean.reason).toContain('102.0°');
  });

  it('names the failing drops of an each-drop spec', () => {
    const c = buildComparison({ ...input, specs: [eachDrop(101)] });
    const v = c.liquids[0].batches[1].verdict.specs[0];
    expect(v.outcome).toBe('fail');
    expect(v.reason).toBe('1 of 3 drops are outside the limits (P1 100.0°).');
  });

  it('gives not-enough-data below three drops', () => {
    const c = buildComparison({ ...input, drops: drops('B-A', [110, 111]) });
    expect(c.liquids[0].batches[0].verdict.outcome).toBe('not-enough-data');
    expect(c.liquids[0].batches[1].verdict.outcome).toBe('not-enough-data');
    expect(c.liquids[0].batches[1].description).toBeNull();
  });

  it('classifies hydrophobicity from the water mean (common-practice thresholds)', () => {
    expect(rb.wettingClass?.class).toBe('hydrophobic');
    const c = buildComparison({ ...input, drops: drops('B-A', [80, 82, 84]) });
    expect(c.liquids[0].batches[0].wettingClass?.class).toBe('hydrophilic');
  });

  it('phrases the Welch t-test against the previous batch in words', () => {
    // Hand check: difference −10°, SE = √(4/3 + 4/3), t = −6.1237, Welch df = 4 exactly.
    const t = -10 / Math.sqrt(8 / 3);
    const p = pStudent4(t);
    expect(water.vsPrevious).toHaveLength(1);
    expect(water.vsPrevious[0].result?.df).toBeCloseTo(4, 10);
    expect(water.vsPrevious[0].result?.t).toBeCloseTo(t, 10);
    expect(water.vsPrevious[0].result?.p).toBeCloseTo(p, 8);
    expect(water.vsPrevious[0].sentence).toBe(
      `B-B is 10.0° lower than B-A (Welch t-test, ${formatP(p)}): a difference at the 5 % level.`,
    );
    expect(formatP(p)).toBe('p = 0.004');
  });

  it('tests every batch against the chosen reference batch', () => {
    const C = batch('B-C', '2026-10-15');
    const c = buildComparison({
      ...input,
      batches: [A, B, C],
      drops: [...input.drops, ...drops('B-C', [109, 112, 115])],
      referenceBatchId: 'B-A',
    });
    const refs = c.liquids[0].vsReference;
    expect(c.referenceBatch?.id).toBe('B-A');
    expect(refs.map((r) => r.batchId)).toEqual(['B-B', 'B-C']);
    // Equal means: said so, not "0.0° lower".
    expect(refs[1].sentence).toMatch(/^B-C and B-A have the same mean \(Welch t-test, p = 1\.000\): not a significant difference/);
  });

  it('runs a one-way ANOVA across batches', () => {
    // Hand check: means 112 and 102, grand mean 107: SSB = 3·5² + 3·5² = 150,
    // SSW = 8 + 8 = 16, F = 150 / (16 / 4) = 37.5.
    expect(water.anova.result?.ssBetween).toBeCloseTo(150, 10);
    expect(water.anova.result?.ssWithin).toBeCloseTo(16, 10);
    expect(water.anova.result?.f).toBeCloseTo(37.5, 10);
    expect(water.anova.sentence).toMatch(/^The batch means differ \(one-way ANOVA, F\(1, 4\) = 37\.50/);
  });

  it('computes Cpk against the each-drop limit', () => {
    // Hand check: one-sided lower limit, Cpl = (102 − 100) / (3 · 2) = 0.333.
    expect(rb.capability?.cpk).toBeCloseTo(1 / 3, 10);
    expect(rb.capability?.rule).toContain('lower limit only');
  });

  it('draws the spec limits as lines', () => {
    expect(water.specLines.map((l) => l.label)).toEqual(['each drop ≥ 100°', 'mean ≥ 105°']);
  });

  it('reports batches out of spec', () => {
    const out = batchesOutOfSpec(comparison);
    expect(out.map((o) => o.batch.id)).toEqual(['B-B']);
    expect(out[0].rule).toContain('mean of the drops ≥ 105°');
  });
});

describe('age window of a spec', () => {
  const spec: ComparisonSpecInput = {
    id: 'pp',
    probeLiquidId: WATER.id,
    minDeg: null,
    maxDeg: 70,
    scope: 'each-drop',
    maxDaysSinceTreatment: 7,
    note: '',
  };
  it('counts only drops measured within the window, and says so', () => {
    const c = buildComparison({
      batches: [batch('F-1', '2026-11-02')],
      liquids: [WATER],
      specs: [spec],
      drops: drops('F-1', [60, 61, 62, 66, 67, 75, 76], { ageDays: [1, 1, 1, 4, 4, 8, 8] }),
    });
    const r = c.liquids[0].batches[0];
    expect(r.drops.map((d) => d.ageDays)).toEqual([1, 1, 1, 4, 4, 8, 8]);
    expect(r.drops.map((d) => d.outsideAgeWindow)).toEqual([false, false, false, false, false, true, true]);
    const v = r.verdict.specs[0];
    expect(v.outcome).toBe('pass'); // the 75° and 76° drops at 8 days do not count
    expect(v.n).toBe(5);
    expect(v.excluded).toBe(2);
    expect(v.rule).toBe(
      "each drop ≤ 70°, at least 3 drops; only drops measured within 7 days of the sample's treatment count",
    );
    expect(v.reason).toContain('2 drops measured later than 7 days');
  });

  it('does not count drops of samples without a treatment time', () => {
    const c = buildComparison({
      batches: [batch('F-1', '2026-11-02')],
      liquids: [WATER],
      specs: [spec],
      drops: drops('F-1', [60, 61, 62]),
    });
    expect(c.liquids[0].batches[0].verdict.outcome).toBe('not-enough-data');
  });
});

describe('outliers and control chart', () => {
  it("flags a drop outside Tukey's fences without removing it", () => {
    // Hand check: Q1 = 101, Q3 = 103 (type 7), IQR = 2, fences 98 and 106: 120 is outside.
    const c = buildComparison({
      batches: [batch('B-1', '2026-10-01')],
      liquids: [WATER],
      specs: [],
      drops: drops('B-1', [100, 101, 102, 103, 120]),
    });
    const r = c.liquids[0].batches[0];
    expect(r.drops.map((d) => d.outlier)).toEqual([false, false, false, false, true]);
    expect(r.outliers?.lowerFence).toBeCloseTo(98, 10);
    expect(r.outliers?.upperFence).toBeCloseTo(106, 10);
    expect(r.description?.n).toBe(5);
    expect(r.verdict.outcome).toBe('no-spec');
    expect(r.capabilityNote).toBe('No spec limits for this liquid.');
  });

  it('puts individuals-chart limits over the batch means in production order', () => {
    // Hand check: means 10, 10, 10, 10, 20 → CL 12, MR̄ = 10/4 = 2.5,
    // UCL = 12 + 2.66·2.5 = 18.65 (I-MR constants, e.g. Montgomery): the last batch is outside.
    const means = [10, 10, 10, 10, 20];
    const bs = means.map((_, i) => batch(`B-${i}`, `2026-10-0${i + 1}`));
    const c = buildComparison({
      batches: [...bs].reverse(),
      liquids: [DIM],
      specs: [],
      drops: means.flatMap((m, i) => drops(`B-${i}`, [m - 1, m, m + 1], { liquid: DIM.id })),
    });
    const trend = c.liquids[0].trend;
    expect(trend?.centreLine).toBeCloseTo(12, 10);
    expect(trend?.ucl).toBeCloseTo(18.65, 10);
    expect(trend?.lcl).toBeCloseTo(5.35, 10);
    expect(trend?.points.map((p) => p.outsideLimits)).toEqual([false, false, false, false, true]);
    // Not water: no hydrophobicity class.
    expect(c.liquids[0].batches[0].wettingClass).toBeNull();
  });

  it('explains why there is no chart with fewer than three batches', () => {
    const c = buildComparison({
      batches: [batch('B-1', '2026-10-01')],
      liquids: [WATER],
      specs: [],
      drops: drops('B-1', [100, 101]),
    });
    expect(c.liquids[0].trend).toBeNull();
    expect(c.liquids[0].trendNote).toContain('at least three values');
    expect(c.liquids[0].anova.result).toBeNull();
  });

  it('says why no Welch test is possible for a single drop', () => {
    const c = buildComparison({
      batches: [batch('B-1', '2026-10-01'), batch('B-2', '2026-10-08')],
      liquids: [WATER],
      specs: [],
      drops: [...drops('B-1', [100, 101]), ...drops('B-2', [99])],
    });
    const test = c.liquids[0].vsPrevious[0];
    expect(test.result).toBeNull();
    expect(test.sentence).toMatch(/^B-2 against B-1: no Welch t-test/);
  });
});

describe('welchSentence', () => {
  it('says higher for a larger mean', () => {
    const c = buildComparison({
      batches: [batch('X', '2026-01-01'), batch('Y', '2026-01-02')],
      liquids: [WATER],
      specs: [],
      drops: [...drops('X', [100, 102, 104]), ...drops('Y', [110, 112, 114])],
    });
    const [x, y] = c.liquids[0].batches;
    expect(welchSentence(y, x).sentence).toMatch(/^Y is 10\.0° higher than X/);
  });
});
