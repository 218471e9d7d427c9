import { describe, expect, it } from 'vitest';
import { StatsInputError, welchTTest } from '@/lib/stats';
import { tCriticalByIntegration, tTwoSidedTailByIntegration } from './helpers';

describe("Welch's t-test", () => {
  // Worked example derived by hand:
  //   A = 1..5: mean 3, variance 2.5;  B = 2,4,…,10: mean 6, variance 10.
  //   SE² = 2.5/5 + 10/5 = 2.5, t = −3/√2.5 = −1.897367
  //   df = 2.5² / ((0.5)²/4 + 2²/4) = 6.25/1.0625 = 100/17 = 5.882353
  // The p-value and CI quantile come from an independent integration of the t density.
  const A = [1, 2, 3, 4, 5];
  const B = [2, 4, 6, 8, 10];

  it('t, Welch–Satterthwaite df and difference match the hand derivation', () => {
    const r = welchTTest(A, B);
    expect(r.difference).toBe(-3);
    expect(r.standardError).toBeCloseTo(Math.sqrt(2.5), 12);
    expect(r.t).toBeCloseTo(-3 / Math.sqrt(2.5), 12);
    expect(r.df).toBeCloseTo(100 / 17, 12);
  });

  it('two-sided p and the 95 % CI of the difference match the independent integration', () => {
    const r = welchTTest(A, B);
    expect(r.p).toBeCloseTo(tTwoSidedTailByIntegration(3 / Math.sqrt(2.5), 100 / 17), 8);
    expect(r.p).toBeGreaterThan(0.1);
    expect(r.p).toBeLessThan(0.11);
    const q = tCriticalByIntegration(0.05, 100 / 17);
    expect(r.differenceCi.lower).toBeCloseTo(-3 - q * Math.sqrt(2.5), 6);
    expect(r.differenceCi.upper).toBeCloseTo(-3 + q * Math.sqrt(2.5), 6);
  });

  it('equal sizes and variances give df = 2(n − 1), the pooled-test value', () => {
    const r = welchTTest([1, 2, 3], [11, 12, 13]);
    expect(r.df).toBeCloseTo(4, 12);
    expect(r.t).toBeCloseTo(-10 / Math.sqrt(2 / 3), 12);
    expect(r.p).toBeLessThan(0.001);
  });

  it('swapping the groups flips the sign only', () => {
    const a = welchTTest(A, B);
    const b = welchTTest(B, A);
    expect(b.t).toBeCloseTo(-a.t, 12);
    expect(b.p).toBeCloseTo(a.p, 12);
  });

  it('bad input throws StatsInputError', () => {
    expect(() => welchTTest([1], [1, 2])).toThrow(StatsInputError);
    expect(() => welchTTest([1, 1], [2, 2])).toThrow(/no spread/);
    expect(() => welchTTest([1, Infinity], [2, 3])).toThrow(/Group A/);
  });
});
