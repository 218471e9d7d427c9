/**
 * Student t and F distributions (jStat underneath) against printed tables and an independent
 * numerical integration written in tests/unit/stats/helpers.ts.
 */
import { describe, expect, it } from 'vitest';
import {
  fUpperTailP,
  studentTCritical,
  studentTQuantile,
  studentTTwoSidedP,
  StatsInputError,
} from '@/lib/stats';
import { tCriticalByIntegration, tTwoSidedTailByIntegration } from './helpers';

describe('Student t quantiles', () => {
  // Printed Student t tables (two-sided 95 %, i.e. the 0.975 quantile), as reproduced in every
  // statistics textbook appendix; values written from memory and cross-checked below by
  // integrating the t density independently of jStat.
  const printed: [number, number, number][] = [
    [0.975, 1, 12.706],
    [0.975, 4, 2.776],
    [0.975, 9, 2.262],
    [0.975, 29, 2.045],
    [0.95, 20, 1.725],
    [0.995, 10, 3.169],
  ];
  it.each(printed)('t(%s, %s) = %s as in printed tables', (p, df, value) => {
    expect(studentTQuantile(p, df)).toBeCloseTo(value, 3);
  });

  it.each([4, 9, 29, 5.882352941176471])(
    't(0.975, %s) agrees with an independent integration to 1e-6',
    (df) => {
      expect(studentTCritical(0.95, df)).toBeCloseTo(tCriticalByIntegration(0.05, df), 6);
    },
  );

  it('rejects impossible probabilities and degrees of freedom', () => {
    expect(() => studentTQuantile(1, 5)).toThrow(StatsInputError);
    expect(() => studentTQuantile(0.5, 0)).toThrow(StatsInputError);
    expect(() => studentTCritical(95, 5)).toThrow(/between 0 and 1/);
  });
});

describe('p-values', () => {
  it.each([
    [2.262, 9],
    [0.5, 3],
    [4.2, 7.5],
  ])('two-sided t p-value for t = %s, df = %s agrees with independent integration', (t, df) => {
    expect(studentTTwoSidedP(t, df)).toBeCloseTo(tTwoSidedTailByIntegration(t, df), 8);
    expect(studentTTwoSidedP(-t, df)).toBeCloseTo(studentTTwoSidedP(t, df), 14);
  });

  it('F(2, d2) upper tail matches its closed form (1 + 2f/d2)^(−d2/2)', () => {
    for (const [f, d2] of [
      [0.5, 10],
      [3.5, 12],
      [10, 30],
    ]) {
      expect(fUpperTailP(f, 2, d2)).toBeCloseTo(Math.pow(1 + (2 * f) / d2, -d2 / 2), 10);
    }
  });

  it('printed F table: F(0.95; 4, 20) = 2.87 has an upper tail of about 0.05', () => {
    // Printed F tables (5 % points), from memory; 2.87 is rounded, hence the loose tolerance.
    expect(fUpperTailP(2.87, 4, 20)).toBeCloseTo(0.05, 3);
  });
});
