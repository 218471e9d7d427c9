import { StatsInputError, assertConfidenceLevel, assertFiniteValues } from './errors';
import { mean, sumOfSquaredDeviations } from './describe';
import { studentTCritical, studentTTwoSidedP } from './distributions';

/** Result of Welch's unequal-variances t-test between groups A and B. */
export interface WelchTTestResult {
  method: "Welch's t-test (unequal variances), two-sided";
  nA: number;
  nB: number;
  meanA: number;
  meanB: number;
  sdA: number;
  sdB: number;
  /** meanA − meanB. */
  difference: number;
  /** Standard error of the difference, √(sA²/nA + sB²/nB). */
  standardError: number;
  t: number;
  /** Welch–Satterthwaite degrees of freedom (not an integer in general). */
  df: number;
  /** Two-sided p-value. */
  p: number;
  /** Confidence interval of meanA − meanB at `level`. */
  differenceCi: { level: number; lower: number; upper: number };
}

/**
 * Welch's t-test for two groups that may have different variances (Welch, Biometrika 1947),
 * with the Welch–Satterthwaite degrees of freedom (Satterthwaite, Biometrics Bulletin 1946).
 */
export function welchTTest(
  groupA: readonly number[],
  groupB: readonly number[],
  options: { confidenceLevel?: number } = {},
): WelchTTestResult {
  assertFiniteValues(groupA, 'Group A');
  assertFiniteValues(groupB, 'Group B');
  const level = options.confidenceLevel ?? 0.95;
  assertConfidenceLevel(level);
  const nA = groupA.length;
  const nB = groupB.length;
  if (nA < 2 || nB < 2) {
    throw new StatsInputError(
      'too-few-values',
      `Welch's t-test needs at least two values in each group (got ${nA} and ${nB}); measure more drops.`,
    );
  }
  const meanA = mean(groupA);
  const meanB = mean(groupB);
  const varA = sumOfSquaredDeviations(groupA, meanA) / (nA - 1);
  const varB = sumOfSquaredDeviations(groupB, meanB) / (nB - 1);
  const vA = varA / nA;
  const vB = varB / nB;
  const se2 = vA + vB;
  if (!(se2 > 0)) {
    throw new StatsInputError(
      'zero-variance',
      'Both groups have no spread at all (every value identical), so a t-test cannot be computed. Check the data.',
    );
  }
  const standardError = Math.sqrt(se2);
  const difference = meanA - meanB;
  const t = difference / standardError;
  const df = (se2 * se2) / ((vA * vA) / (nA - 1) + (vB * vB) / (nB - 1));
  const tCritical = studentTCritical(level, df);
  return {
    method: "Welch's t-test (unequal variances), two-sided",
    nA,
    nB,
    meanA,
    meanB,
    sdA: Math.sqrt(varA),
    sdB: Math.sqrt(varB),
    difference,
    standardError,
    t,
    df,
    p: studentTTwoSidedP(t, df),
    differenceCi: {
      level,
      lower: difference - tCritical * standardError,
      upper: difference + tCritical * standardError,
    },
  };
}
