import { StatsInputError, assertFiniteValues } from './errors';
import { mean } from './describe';
import { fUpperTailP } from './distributions';

/** One-way analysis of variance table (Fisher, 1925). */
export interface OneWayAnovaResult {
  method: 'One-way ANOVA (fixed effects)';
  k: number;
  n: number;
  groupMeans: number[];
  groupSizes: number[];
  grandMean: number;
  ssBetween: number;
  ssWithin: number;
  ssTotal: number;
  dfBetween: number;
  dfWithin: number;
  msBetween: number;
  msWithin: number;
  f: number;
  /** Upper-tail p-value of F(dfBetween, dfWithin). */
  p: number;
  /** ssBetween / ssTotal. */
  rSquared: number;
  /** √msWithin, the pooled within-group SD. */
  residualSd: number;
}

/**
 * One-way ANOVA across k groups (e.g. batches). Sums of squares are formed from deviations
 * about the group and grand means (two-pass), which keeps accuracy on data with many constant
 * leading digits — checked against the NIST StRD ANOVA datasets.
 */
export function oneWayAnova(groups: readonly (readonly number[])[]): OneWayAnovaResult {
  if (!Array.isArray(groups) || groups.length < 2) {
    throw new StatsInputError(
      'too-few-groups',
      'ANOVA needs at least two groups (e.g. two batches) to compare.',
    );
  }
  groups.forEach((g, i) => {
    assertFiniteValues(g, `Group ${i + 1}`);
    if (g.length < 1) {
      throw new StatsInputError(
        'empty-group',
        `Group ${i + 1} is empty; remove it or add its measurements.`,
      );
    }
  });
  const k = groups.length;
  const n = groups.reduce((acc, g) => acc + g.length, 0);
  if (n - k < 1) {
    throw new StatsInputError(
      'too-few-values',
      'ANOVA needs at least one group with two or more values to estimate the within-group spread.',
    );
  }
  // Shift by the first value so that sums are formed on small numbers (data with many
  // constant leading digits lose less precision this way).
  const shift = groups[0][0];
  const shifted = groups.map((g) => g.map((v: number) => v - shift));
  const groupMeansShifted = shifted.map((g) => mean(g));
  const all = shifted.flat();
  const grandShifted = mean(all);
  let ssWithin = 0;
  let ssBetween = 0;
  shifted.forEach((g, i) => {
    const m = groupMeansShifted[i];
    for (const v of g) ssWithin += (v - m) * (v - m);
    ssBetween += g.length * (m - grandShifted) * (m - grandShifted);
  });
  const dfBetween = k - 1;
  const dfWithin = n - k;
  const msBetween = ssBetween / dfBetween;
  const msWithin = ssWithin / dfWithin;
  if (!(msWithin > 0)) {
    throw new StatsInputError(
      'zero-variance',
      'Every group has zero spread (identical values within each group), so F cannot be formed. Check the data.',
    );
  }
  const f = msBetween / msWithin;
  const ssTotal = ssBetween + ssWithin;
  return {
    method: 'One-way ANOVA (fixed effects)',
    k,
    n,
    groupMeans: groupMeansShifted.map((m) => m + shift),
    groupSizes: groups.map((g) => g.length),
    grandMean: grandShifted + shift,
    ssBetween,
    ssWithin,
    ssTotal,
    dfBetween,
    dfWithin,
    msBetween,
    msWithin,
    f,
    p: fUpperTailP(f, dfBetween, dfWithin),
    rSquared: ssTotal > 0 ? ssBetween / ssTotal : 0,
    residualSd: Math.sqrt(msWithin),
  };
}
