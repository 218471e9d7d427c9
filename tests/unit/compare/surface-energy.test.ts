import { describe, expect, it } from 'vitest';
import {
  SURFACE_ENERGY_LABEL,
  batchesOutOfSpec,
  buildComparison,
  verdictOutcomes,
  type ComparisonBatchInput,
  type ComparisonDropInput,
  type ComparisonSpecInput,
} from '@/lib/compare';
import { STROM_DIIODOMETHANE, STROM_WATER, owrkByHand } from '../../support/owrk-by-hand';

/*
 * The surface-energy verdict of the compare page: OWRK over each batch's mean angle per probe
 * liquid, judged against the coating's surface-energy limits.
 * Liquid components: Ström, Fredriksson & Stenius, J. Colloid Interface Sci. 119 (1987) —
 * water 72.8 = 21.8 (dispersive) + 51.0 (polar), diiodomethane 50.8 = 50.8 + 0 mN/m.
 */
const WATER = { id: 'liquid-water', name: 'Water', ...STROM_WATER };
const DIM = { id: 'liquid-diiodomethane', name: 'Diiodomethane', ...STROM_DIIODOMETHANE };
const LAB_LIQUID = { id: 'liquid-lab', name: 'Lab mix', gammaTotal: 40, gammaDispersive: null, gammaPolar: null };

const batch = (id: string, producedOn: string): ComparisonBatchInput => ({ id, lotCode: id, producedOn });

let seq = 0;
function drops(
  batchId: string,
  liquidId: string,
  angles: number[],
  ageDays?: number[],
): ComparisonDropInput[] {
  const treatedAt = '2026-11-02T08:00:00.000Z';
  return angles.map((a, i) => ({
    dropId: `d${++seq}`,
    batchId,
    sampleId: `${batchId}-s`,
    sampleLabel: 'D1',
    probeLiquidId: liquidId,
    measuredAt: new Date(Date.parse(treatedAt) + (ageDays?.[i] ?? 1) * 86_400_000).toISOString(),
    treatedAt: ageDays ? treatedAt : null,
    leftDeg: a,
    rightDeg: a,
    meanDeg: a,
  }));
}

const sfeSpec = (limits: { min?: number; max?: number; days?: number }): ComparisonSpecInput => ({
  id: 'spec-sfe',
  probeLiquidId: WATER.id,
  minDeg: null,
  maxDeg: null,
  scope: 'each-drop',
  maxDaysSinceTreatment: limits.days ?? null,
  minSurfaceEnergyMnM: limits.min ?? null,
  maxSurfaceEnergyMnM: limits.max ?? null,
  note: '',
});

const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
const sd = (xs: number[]) => {
  const m = mean(xs);
  return Math.sqrt(xs.reduce((a, x) => a + (x - m) ** 2, 0) / (xs.length - 1));
};

describe('surface free energy in the comparison', () => {
  const A = batch('F-A', '2026-11-02');
  const B = batch('F-B', '2026-11-09');
  const waterA = [60, 61, 62];
  const dimA = [39, 40, 41];
  const waterB = [88, 89, 90];
  const dimB = [58, 59, 60];
  const comparison = buildComparison({
    batches: [A, B],
    liquids: [WATER, DIM],
    specs: [sfeSpec({ min: 38 })],
    drops: [
      ...drops('F-A', WATER.id, waterA),
      ...drops('F-A', DIM.id, dimA),
      ...drops('F-B', WATER.id, waterB),
      ...drops('F-B', DIM.id, dimB),
    ],
  });
  const se = comparison.surfaceEnergy!;
  const [ra, rb] = se.batches;

  it('computes OWRK from each liquid’s mean angle, equal to the closed-form solution', () => {
    const hand = owrkByHand(mean(waterA), mean(dimA));
    expect(ra.total?.value).toBeCloseTo(hand.total, 9);
    expect(ra.dispersive?.value).toBeCloseTo(hand.dispersive, 9);
    expect(ra.polar?.value).toBeCloseTo(hand.polar, 9);
    expect(ra.liquids.map((l) => [l.name, l.n])).toEqual([
      ['Diiodomethane', 3],
      ['Water', 3],
    ]);
  });

  it('propagates the standard error of each mean angle to first order (JCGM 100:2008), as the hand derivative does', () => {
    // First-order law of propagation with numerical derivatives of the closed form.
    const h = 1e-4;
    const uW = sd(waterA) / Math.sqrt(3);
    const uD = sd(dimA) / Math.sqrt(3);
    const dW = (owrkByHand(mean(waterA) + h, mean(dimA)).total - owrkByHand(mean(waterA) - h, mean(dimA)).total) / (2 * h);
    const dD = (owrkByHand(mean(waterA), mean(dimA) + h).total - owrkByHand(mean(waterA), mean(dimA) - h).total) / (2 * h);
    const linear = Math.hypot(dW * uW, dD * uD);
    expect(ra.total!.standardUncertainty / linear).toBeCloseTo(1, 4);
  });

  it('passes a batch above the minimum and fails one below it, with the rule and the value in words', () => {
    expect(owrkByHand(mean(waterB), mean(dimB)).total).toBeLessThan(38);
    expect(ra.verdict.outcome).toBe('pass');
    expect(rb.verdict.outcome).toBe('fail');
    const [verdict] = rb.verdict.specs;
    expect(verdict.rule).toBe('surface free energy (OWRK) at least 38 mN/m');
    expect(verdict.reason).toMatch(/^\d+\.\d ± \d+\.\d mN\/m is below the minimum of 38 mN\/m\./);
    expect(ra.verdict.specs[0].reason).toContain('meets the minimum of 38 mN/m');
  });

  it('lists a failing batch among the out-of-spec batches and in the verdict outcomes', () => {
    expect(batchesOutOfSpec(comparison)).toEqual([
      expect.objectContaining({ batch: B, liquidName: SURFACE_ENERGY_LABEL }),
    ]);
    expect(verdictOutcomes(comparison)).toContain('fail');
    expect(se.limitLabels).toEqual(['≥ 38 mN/m']);
  });

  it('calls a verdict marginal when the limit lies within the expanded uncertainty', () => {
    const total = ra.total!;
    const near = buildComparison({
      batches: [A],
      liquids: [WATER, DIM],
      specs: [sfeSpec({ min: Number((total.value - total.standardUncertainty).toFixed(2)) })],
      drops: [...drops('F-A', WATER.id, waterA), ...drops('F-A', DIM.id, dimA)],
    }).surfaceEnergy!.batches[0];
    expect(near.verdict.outcome).toBe('pass');
    expect(near.verdict.specs[0].reason).toContain('marginal');
    expect(ra.verdict.specs[0].reason).not.toContain('marginal');
  });

  it('judges a maximum and a range', () => {
    const upper = buildComparison({
      batches: [A],
      liquids: [WATER, DIM],
      specs: [sfeSpec({ min: 30, max: 40 })],
      drops: [...drops('F-A', WATER.id, waterA), ...drops('F-A', DIM.id, dimA)],
    }).surfaceEnergy!.batches[0].verdict.specs[0];
    expect(upper.outcome).toBe('fail');
    expect(upper.rule).toBe('surface free energy (OWRK) between 30 mN/m and 40 mN/m');
    expect(upper.reason).toContain('above the maximum of 40 mN/m');
  });
});

describe('surface-energy verdict without enough data', () => {
  const A = batch('F-A', '2026-11-02');

  it('says so when only one liquid was measured, and when a liquid has fewer than 3 drops', () => {
    const oneLiquid = buildComparison({
      batches: [A],
      liquids: [WATER, DIM],
      specs: [sfeSpec({ min: 38 })],
      drops: drops('F-A', WATER.id, [60, 61, 62]),
    }).surfaceEnergy!.batches[0];
    expect(oneLiquid.total).toBeNull();
    expect(oneLiquid.verdict.outcome).toBe('not-enough-data');
    expect(oneLiquid.verdict.specs[0].reason).toContain('OWRK needs a second liquid of different polarity');

    const twoDrops = buildComparison({
      batches: [A],
      liquids: [WATER, DIM],
      specs: [sfeSpec({ min: 38 })],
      drops: [...drops('F-A', WATER.id, [60, 61, 62]), ...drops('F-A', DIM.id, [40, 41])],
    }).surfaceEnergy!.batches[0];
    expect(twoDrops.total).not.toBeNull();
    expect(twoDrops.verdict.outcome).toBe('not-enough-data');
    expect(twoDrops.verdict.specs[0].reason).toBe(
      'Diiodomethane has 2 drops; a verdict needs at least 3 drops of each liquid.',
    );
  });

  it('leaves out a liquid without a dispersive/polar split', () => {
    const c = buildComparison({
      batches: [A],
      liquids: [WATER, LAB_LIQUID],
      specs: [sfeSpec({ min: 38 })],
      drops: [...drops('F-A', WATER.id, [60, 61, 62]), ...drops('F-A', LAB_LIQUID.id, [30, 31, 32])],
    }).surfaceEnergy!.batches[0];
    expect(c.liquids.map((l) => l.name)).toEqual(['Water']);
    expect(c.verdict.outcome).toBe('not-enough-data');
  });

  it('counts only drops within the spec’s days since treatment', () => {
    const c = buildComparison({
      batches: [A],
      liquids: [WATER, DIM],
      specs: [sfeSpec({ min: 38, days: 7 })],
      drops: [
        ...drops('F-A', WATER.id, [60, 61, 62, 90], [1, 2, 3, 8]),
        ...drops('F-A', DIM.id, [39, 40, 41, 70], [1, 2, 3, 8]),
      ],
    }).surfaceEnergy!;
    const r = c.batches[0];
    expect(r.excluded).toBe(2);
    expect(r.total?.value).toBeCloseTo(owrkByHand(61, 40).total, 9);
    expect(r.verdict.specs[0].rule).toContain('within 7 days');
    expect(r.verdict.specs[0].reason).toContain('2 drops outside the 7-day window did not count.');
    expect(c.windowDays).toBe(7);
    expect(c.limitLabels).toEqual(['≥ 38 mN/m, ≤ 7 d']);
  });

  it('shows values without a verdict when the coating has no surface-energy limit', () => {
    const c = buildComparison({
      batches: [A],
      liquids: [WATER, DIM],
      specs: [],
      drops: [...drops('F-A', WATER.id, [60, 61, 62]), ...drops('F-A', DIM.id, [39, 40, 41])],
    });
    expect(c.surfaceEnergy?.batches[0].verdict.outcome).toBe('no-spec');
    expect(c.surfaceEnergy?.batches[0].total).not.toBeNull();
    expect(batchesOutOfSpec(c)).toEqual([]);
  });

  it('has no surface-energy part when there is neither a limit nor a second liquid', () => {
    const c = buildComparison({
      batches: [A],
      liquids: [WATER],
      specs: [],
      drops: drops('F-A', WATER.id, [100, 101, 102]),
    });
    expect(c.surfaceEnergy).toBeNull();
  });
});
