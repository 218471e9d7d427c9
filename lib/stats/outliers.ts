import { StatsInputError, assertFiniteValues } from './errors';
import { mean, quantile, sumOfSquaredDeviations } from './describe';
import { studentTQuantile } from './distributions';

export interface TukeyFencesResult {
  rule: "Tukey's fences: outside [Q1 − k·IQR, Q3 + k·IQR]";
  k: number;
  q1: number;
  q3: number;
  iqr: number;
  lowerFence: number;
  upperFence: number;
  /** Indices (0-based, into the input) of flagged values. */
  outlierIndices: number[];
  quartileDefinition: 'linear interpolation between order statistics (Hyndman & Fan type 7)';
}

/**
 * Flag values outside Tukey's fences (Tukey, *Exploratory Data Analysis*, 1977), k = 1.5 by
 * default. Quartiles by linear interpolation (Hyndman & Fan 1996, type 7).
 */
export function tukeyFences(
  values: readonly number[],
  options: { k?: number } = {},
): TukeyFencesResult {
  assertFiniteValues(values, 'Values');
  const k = options.k ?? 1.5;
  if (!Number.isFinite(k) || k <= 0) {
    throw new StatsInputError(
      'bad-parameter',
      `The fence multiplier k must be positive (commonly 1.5), got ${String(k)}.`,
    );
  }
  if (values.length < 4) {
    throw new StatsInputError(
      'too-few-values',
      `Tukey's fences need at least four values (got ${values.length}).`,
    );
  }
  const q1 = quantile(values, 0.25);
  const q3 = quantile(values, 0.75);
  const iqr = q3 - q1;
  const lowerFence = q1 - k * iqr;
  const upperFence = q3 + k * iqr;
  const outlierIndices: number[] = [];
  values.forEach((v, i) => {
    if (v < lowerFence || v > upperFence) outlierIndices.push(i);
  });
  return {
    rule: "Tukey's fences: outside [Q1 − k·IQR, Q3 + k·IQR]",
    k,
    q1,
    q3,
    iqr,
    lowerFence,
    upperFence,
    outlierIndices,
    quartileDefinition: 'linear interpolation between order statistics (Hyndman & Fan type 7)',
  };
}

/** Two-sided critical value of Grubbs' statistic G for n values at significance alpha. */
export function grubbsCriticalValue(n: number, alpha = 0.05): number {
  if (!Number.isInteger(n) || n < 3) {
    throw new StatsInputError(
      'too-few-values',
      `Grubbs' test needs at least three values (got ${String(n)}).`,
    );
  }
  if (!Number.isFinite(alpha) || alpha <= 0 || alpha >= 1) {
    throw new StatsInputError(
      'bad-parameter',
      `Significance level must lie between 0 and 1 (e.g. 0.05), got ${String(alpha)}.`,
    );
  }
  const t = studentTQuantile(1 - alpha / (2 * n), n - 2);
  return ((n - 1) / Math.sqrt(n)) * Math.sqrt((t * t) / (n - 2 + t * t));
}

export interface GrubbsStep {
  /** Index (0-based, into the original input) of the most extreme remaining value. */
  index: number;
  value: number;
  g: number;
  gCritical: number;
  n: number;
  isOutlier: boolean;
}

export interface GrubbsResult {
  rule: string;
  alpha: number;
  steps: GrubbsStep[];
  outlierIndices: number[];
}

/**
 * Grubbs' test for a single outlier, two-sided (Grubbs, Technometrics 11, 1969; also
 * ASTM E178): G = max|xᵢ − x̄| / s against G_crit = (n−1)/√n · √(t²/(n−2+t²)), t the
 * upper α/(2n) quantile of Student t with n − 2 df. Assumes normally distributed data.
 * With `repeat: true` the flagged value is removed and the test repeated until none is found
 * (at most n − 3 times); by default a single pass.
 */
export function grubbsTest(
  values: readonly number[],
  options: { alpha?: number; repeat?: boolean } = {},
): GrubbsResult {
  assertFiniteValues(values, 'Values');
  const alpha = options.alpha ?? 0.05;
  const repeat = options.repeat ?? false;
  if (values.length < 3) {
    throw new StatsInputError(
      'too-few-values',
      `Grubbs' test needs at least three values (got ${values.length}).`,
    );
  }
  let remaining = values.map((value, index) => ({ value, index }));
  const steps: GrubbsStep[] = [];
  while (remaining.length >= 3) {
    const vs = remaining.map((r) => r.value);
    const m = mean(vs);
    const s = Math.sqrt(sumOfSquaredDeviations(vs, m) / (vs.length - 1));
    if (!(s > 0)) break;
    let worst = remaining[0];
    for (const r of remaining) if (Math.abs(r.value - m) > Math.abs(worst.value - m)) worst = r;
    const g = Math.abs(worst.value - m) / s;
    const gCritical = grubbsCriticalValue(vs.length, alpha);
    const isOutlier = g > gCritical;
    steps.push({ index: worst.index, value: worst.value, g, gCritical, n: vs.length, isOutlier });
    if (!isOutlier || !repeat) break;
    remaining = remaining.filter((r) => r !== worst);
  }
  return {
    rule: `Grubbs' test, two-sided, α = ${alpha}${repeat ? ', repeated' : ', single pass'}`,
    alpha,
    steps,
    outlierIndices: steps.filter((s) => s.isOutlier).map((s) => s.index),
  };
}
