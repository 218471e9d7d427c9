import { StatsInputError, assertConfidenceLevel, assertFiniteValues } from './errors';
import { studentTCritical } from './distributions';

/** A two-sided confidence interval for a mean, built on Student's t distribution. */
export interface ConfidenceInterval {
  /** Confidence level as a fraction, e.g. 0.95. */
  level: number;
  lower: number;
  upper: number;
  /** t_{1−α/2, df} · standard error. */
  halfWidth: number;
  /** The Student t critical value used. */
  tCritical: number;
  df: number;
}

/** Summary of one set of values (e.g. the angles of the drops of one sample). */
export interface Description {
  n: number;
  mean: number;
  /** Sample standard deviation (divisor n − 1); null when n < 2. */
  sd: number | null;
  /** Standard error of the mean, sd / √n; null when n < 2. */
  standardError: number | null;
  /** Student t interval for the mean at the requested level; null when n < 2. */
  ci: ConfidenceInterval | null;
  min: number;
  max: number;
  median: number;
}

/** Arithmetic mean (plain sum, then a one-step correction against rounding). */
export function mean(values: readonly number[]): number {
  const n = values.length;
  let sum = 0;
  for (const v of values) sum += v;
  const m = sum / n;
  let residual = 0;
  for (const v of values) residual += v - m;
  return m + residual / n;
}

/**
 * Sum of squared deviations from the mean, by the corrected two-pass algorithm
 * (Chan, Golub & LeVeque, "Algorithms for computing the sample variance", Am. Stat. 1983).
 */
export function sumOfSquaredDeviations(values: readonly number[], centre = mean(values)): number {
  let ss = 0;
  let s = 0;
  for (const v of values) {
    const d = v - centre;
    ss += d * d;
    s += d;
  }
  return Math.max(0, ss - (s * s) / values.length);
}

/** Sample variance (divisor n − 1). Needs at least two values. */
export function sampleVariance(values: readonly number[]): number {
  assertFiniteValues(values, 'Values');
  if (values.length < 2) {
    throw new StatsInputError(
      'too-few-values',
      'A standard deviation needs at least two values; add more drops.',
    );
  }
  return sumOfSquaredDeviations(values) / (values.length - 1);
}

/** Sample standard deviation (divisor n − 1). Needs at least two values. */
export function sampleSd(values: readonly number[]): number {
  return Math.sqrt(sampleVariance(values));
}

/**
 * Quantile by linear interpolation between order statistics, x[(n−1)p] (Hyndman & Fan 1996,
 * definition 7 — the default of R's `quantile` and of most spreadsheets).
 */
export function quantile(values: readonly number[], p: number): number {
  assertFiniteValues(values, 'Values');
  if (values.length === 0)
    throw new StatsInputError('too-few-values', 'A quantile needs at least one value.');
  if (!Number.isFinite(p) || p < 0 || p > 1) {
    throw new StatsInputError(
      'bad-probability',
      `Quantile probability must lie between 0 and 1, got ${String(p)}.`,
    );
  }
  const sorted = [...values].sort((a, b) => a - b);
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/** Median (middle value, or the average of the two middle values). */
export function median(values: readonly number[]): number {
  return quantile(values, 0.5);
}

/**
 * Student t confidence interval for the mean: mean ± t_{1−α/2, n−1} · s/√n
 * (Student, "The probable error of a mean", Biometrika 1908).
 */
export function confidenceInterval(values: readonly number[], level = 0.95): ConfidenceInterval {
  assertFiniteValues(values, 'Values');
  assertConfidenceLevel(level);
  const n = values.length;
  if (n < 2) {
    throw new StatsInputError(
      'too-few-values',
      'A confidence interval needs at least two values; measure more drops.',
    );
  }
  const m = mean(values);
  const se = Math.sqrt(sumOfSquaredDeviations(values, m) / (n - 1) / n);
  const df = n - 1;
  const tCritical = studentTCritical(level, df);
  const halfWidth = tCritical * se;
  return { level, lower: m - halfWidth, upper: m + halfWidth, halfWidth, tCritical, df };
}

/**
 * Describe a set of values: n, mean, sample SD, standard error, Student t confidence interval
 * (95 % unless another level is given), min, max and median.
 */
export function describe(
  values: readonly number[],
  options: { confidenceLevel?: number } = {},
): Description {
  assertFiniteValues(values, 'Values');
  const level = options.confidenceLevel ?? 0.95;
  assertConfidenceLevel(level);
  const n = values.length;
  if (n === 0) {
    throw new StatsInputError(
      'too-few-values',
      'There are no values to describe; add at least one measurement.',
    );
  }
  const m = mean(values);
  let min = values[0];
  let max = values[0];
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const med = median(values);
  if (n < 2) {
    return { n, mean: m, sd: null, standardError: null, ci: null, min, max, median: med };
  }
  const sd = Math.sqrt(sumOfSquaredDeviations(values, m) / (n - 1));
  return {
    n,
    mean: m,
    sd,
    standardError: sd / Math.sqrt(n),
    ci: confidenceInterval(values, level),
    min,
    max,
    median: med,
  };
}
