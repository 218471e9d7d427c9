import { describe, expect, it } from 'vitest';
import {
  capability,
  classifyWetting,
  grubbsCriticalValue,
  grubbsTest,
  IMR_CONSTANTS,
  individualsChart,
  judgeAngles,
  StatsInputError,
  tukeyFences,
} from '@/lib/stats';

describe('individuals (I-MR) control chart', () => {
  it('2.66 is 3/d2 with d2 = 1.128 (SPC constant tables, e.g. Montgomery; from memory, checked by the identity)', () => {
    expect(3 / IMR_CONSTANTS.d2).toBeCloseTo(IMR_CONSTANTS.E2, 2);
    // D4 for n = 2 is 1 + 3·d3/d2 with d3 = 0.853 (same tables): 3.267.
    expect(1 + (3 * 0.853) / 1.128).toBeCloseTo(IMR_CONSTANTS.D4, 2);
  });

  it('hand-derived example flags the jump', () => {
    // Values 10, 12, 11, 13, 12, 30: moving ranges 2, 1, 2, 1, 18 → MR̄ = 4.8;
    // mean = 88/6; UCL = mean + 2.66·4.8 = 27.435 → 30 is outside; MR UCL = 3.267·4.8 = 15.68
    // → the range 18 is outside.
    const c = individualsChart([10, 12, 11, 13, 12, 30]);
    expect(c.meanMovingRange).toBeCloseTo(4.8, 12);
    expect(c.centreLine).toBeCloseTo(88 / 6, 12);
    expect(c.ucl).toBeCloseTo(88 / 6 + 2.66 * 4.8, 12);
    expect(c.lcl).toBeCloseTo(88 / 6 - 2.66 * 4.8, 12);
    expect(c.outOfControl).toEqual([5]);
    expect(c.points[5].movingRangeOutside).toBe(true);
    expect(c.points[0].movingRange).toBeNull();
    expect(c.sigmaWithin).toBeCloseTo(4.8 / 1.128, 12);
  });

  it('a steady series has no points outside', () => {
    expect(individualsChart([105, 106, 104, 105, 107, 105]).outOfControl).toEqual([]);
  });

  it('needs three values', () => {
    expect(() => individualsChart([1, 2])).toThrow(StatsInputError);
  });
});

describe('capability', () => {
  // Values 104, 106, 105, 107, 103: mean 105, Σd² = 10, s = √2.5 (by hand).
  const values = [104, 106, 105, 107, 103];
  const s = Math.sqrt(2.5);

  it('spec minimum only (angle ≥ 100°): Cpk = Cpl = (mean − LSL)/3σ, no Cp', () => {
    const c = capability(values, { lower: 100 });
    expect(c.cp).toBeNull();
    expect(c.cpu).toBeNull();
    expect(c.cpl).toBeCloseTo(5 / (3 * s), 12);
    expect(c.cpk).toBeCloseTo(5 / (3 * s), 12);
    expect(c.rule).toMatch(/lower limit only/);
  });

  it('two-sided: Cp = (USL − LSL)/6σ and Cpk is the nearer side', () => {
    const c = capability(values, { lower: 100, upper: 108 });
    expect(c.cp).toBeCloseTo(8 / (6 * s), 12);
    expect(c.cpk).toBeCloseTo(3 / (3 * s), 12);
  });

  it('moving-range sigma: MR̄/d2 = 2.25/1.128', () => {
    const c = capability(values, { upper: 110 }, { sigmaMethod: 'moving-range' });
    expect(c.sigma).toBeCloseTo(2.25 / 1.128, 12);
    expect(c.cpk).toBeCloseTo(5 / (3 * (2.25 / 1.128)), 12);
  });

  it('bad limits throw', () => {
    expect(() => capability(values, {})).toThrow(/at least one/);
    expect(() => capability(values, { lower: 110, upper: 100 })).toThrow(StatsInputError);
  });
});

describe('outlier flags', () => {
  it("Tukey's fences, k = 1.5 (quartiles by hand, type 7: Q1 = 2.75, Q3 = 6.25, fences −2.5 and 11.5)", () => {
    const r = tukeyFences([1, 2, 3, 4, 5, 6, 7, 20]);
    expect(r.q1).toBeCloseTo(2.75, 12);
    expect(r.q3).toBeCloseTo(6.25, 12);
    expect(r.upperFence).toBeCloseTo(11.5, 12);
    expect(r.outlierIndices).toEqual([7]);
    expect(r.rule).toMatch(/Tukey/);
  });

  it('Grubbs two-sided critical values at α = 0.05 match printed tables (Grubbs 1969 / ASTM E178; from memory)', () => {
    // Cross-check: the n = 3 value must sit just below the largest G possible, (n−1)/√n = 1.1547.
    const printed: [number, number][] = [
      [3, 1.155],
      [4, 1.481],
      [5, 1.715],
      [10, 2.29],
      [20, 2.709],
    ];
    for (const [n, g] of printed) expect(Math.abs(grubbsCriticalValue(n) - g)).toBeLessThan(0.0015);
    expect(grubbsCriticalValue(3)).toBeLessThan(2 / Math.sqrt(3));
  });

  it("Grubbs' test flags a stray drop and names the rule", () => {
    const angles = [104.1, 105.0, 104.6, 105.3, 104.8, 104.4, 96.0];
    const r = grubbsTest(angles);
    expect(r.outlierIndices).toEqual([6]);
    expect(r.steps[0].g).toBeGreaterThan(r.steps[0].gCritical);
    expect(r.rule).toBe("Grubbs' test, two-sided, α = 0.05, single pass");
    expect(grubbsTest([104.1, 105.0, 104.6, 105.3, 104.8]).outlierIndices).toEqual([]);
  });

  it('repeated Grubbs removes flagged values one at a time', () => {
    const r = grubbsTest([10, 10.1, 9.9, 10.05, 9.95, 10.02, 9.98, 10.03, 14, 20], {
      repeat: true,
    });
    expect(r.outlierIndices).toEqual([9, 8]);
  });
});

describe('spec verdict', () => {
  it('each-drop minimum: one low drop fails, with the rule in words', () => {
    const v = judgeAngles([104, 99.5, 106], { minDeg: 100, appliesTo: 'each-drop' });
    expect(v.outcome).toBe('fail');
    expect(v.failingDrops).toEqual([1]);
    expect(v.rule).toBe('each drop ≥ 100°, at least 3 drops');
    expect(v.reason).toMatch(/#2/);
  });

  it('a drop exactly on the limit meets "≥" and "≤"', () => {
    expect(judgeAngles([100, 100, 101], { minDeg: 100, appliesTo: 'each-drop' }).outcome).toBe(
      'pass',
    );
    expect(judgeAngles([70, 69, 70], { maxDeg: 70, appliesTo: 'each-drop' }).outcome).toBe('pass');
  });

  it('mean spec passes on the mean even with one low drop', () => {
    const v = judgeAngles([104, 99.5, 112], { minDeg: 105, appliesTo: 'mean' });
    expect(v.outcome).toBe('pass');
    expect(v.mean).toBeCloseTo(105.1666667, 6);
  });

  it('maximum spec (treated film ≤ 70°) and fewer than three drops', () => {
    expect(judgeAngles([65, 68, 71], { maxDeg: 70, appliesTo: 'each-drop' }).outcome).toBe('fail');
    expect(judgeAngles([65, 68], { maxDeg: 70, appliesTo: 'each-drop' }).outcome).toBe(
      'not-enough-data',
    );
    expect(judgeAngles([65, 68], { maxDeg: 70, appliesTo: 'mean' }, { minDrops: 2 }).outcome).toBe(
      'pass',
    );
  });

  it('bad specs throw', () => {
    expect(() => judgeAngles([100], { appliesTo: 'mean' })).toThrow(/neither/);
    expect(() => judgeAngles([100], { minDeg: 110, maxDeg: 100, appliesTo: 'mean' })).toThrow(
      StatsInputError,
    );
    expect(() => judgeAngles([190], { minDeg: 100, appliesTo: 'mean' })).toThrow(
      /between 0° and 180°/,
    );
  });
});

describe('wetting class (common practice, no source)', () => {
  it('thresholds at 90° and 150°', () => {
    expect(classifyWetting(60).class).toBe('hydrophilic');
    expect(classifyWetting(90).class).toBe('neutral');
    expect(classifyWetting(110).class).toBe('hydrophobic');
    expect(classifyWetting(155).class).toBe('superhydrophobic-unconfirmed');
    expect(classifyWetting(155, { hysteresisDeg: 4 }).class).toBe('superhydrophobic');
    expect(classifyWetting(155, { hysteresisDeg: 30 }).class).toBe('hydrophobic');
    expect(classifyWetting(110).basis).toBe('common practice, no source');
  });
  it('rejects angles outside 0–180°', () => {
    expect(() => classifyWetting(-1)).toThrow(StatsInputError);
  });
});
