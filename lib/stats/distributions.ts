import { jStat } from 'jstat';
import { StatsInputError, assertConfidenceLevel } from './errors';

function assertDf(df: number, name = 'Degrees of freedom'): void {
  if (!Number.isFinite(df) || df <= 0) {
    throw new StatsInputError('bad-df', `${name} must be a positive number, got ${String(df)}.`);
  }
}

/** Student t quantile: the value t with P(T ≤ t) = p for `df` degrees of freedom (jStat). */
export function studentTQuantile(p: number, df: number): number {
  if (!Number.isFinite(p) || p <= 0 || p >= 1) {
    throw new StatsInputError(
      'bad-probability',
      `Probability must lie strictly between 0 and 1, got ${String(p)}.`,
    );
  }
  assertDf(df);
  return jStat.studentt.inv(p, df);
}

/** Two-sided critical value t_{1−α/2, df} for a confidence level such as 0.95. */
export function studentTCritical(confidenceLevel: number, df: number): number {
  assertConfidenceLevel(confidenceLevel);
  return studentTQuantile(1 - (1 - confidenceLevel) / 2, df);
}

/**
 * Two-sided p-value P(|T| ≥ |t|) for Student's t with `df` degrees of freedom.
 * Computed as the regularised incomplete beta I_{df/(df+t²)}(df/2, 1/2), which keeps
 * precision for small p where 1 − cdf would cancel.
 */
export function studentTTwoSidedP(t: number, df: number): number {
  assertDf(df);
  if (Number.isNaN(t)) throw new StatsInputError('not-finite', 'The t statistic is NaN.');
  if (!Number.isFinite(t)) return 0;
  return jStat.ibeta(df / (df + t * t), df / 2, 0.5);
}

/**
 * Upper-tail p-value P(F ≥ f) of the F distribution with (df1, df2) degrees of freedom,
 * as I_{df2/(df2+df1·f)}(df2/2, df1/2).
 */
export function fUpperTailP(f: number, df1: number, df2: number): number {
  assertDf(df1, 'Numerator degrees of freedom');
  assertDf(df2, 'Denominator degrees of freedom');
  if (Number.isNaN(f)) throw new StatsInputError('not-finite', 'The F statistic is NaN.');
  if (f <= 0) return 1;
  if (!Number.isFinite(f)) return 0;
  return jStat.ibeta(df2 / (df2 + df1 * f), df2 / 2, df1 / 2);
}
