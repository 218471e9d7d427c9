import { StatsInputError, assertFiniteValues } from './errors';
import { mean } from './describe';

/**
 * Control-chart constants for moving ranges of two consecutive points (subgroup size 2),
 * as tabulated in statistical-quality-control texts (e.g. Montgomery, *Introduction to
 * Statistical Quality Control*): d2 = 1.128, D3 = 0, D4 = 3.267. The individuals-chart factor
 * 2.66 is 3/d2, rounded as it is printed in those tables.
 */
export const IMR_CONSTANTS = { d2: 1.128, D3: 0, D4: 3.267, E2: 2.66 } as const;

export interface ControlChartPoint {
  index: number;
  value: number;
  /** |x_i − x_{i−1}|; null for the first point. */
  movingRange: number | null;
  /** The value lies above UCL or below LCL of the individuals chart. */
  outsideLimits: boolean;
  /** The moving range lies above the moving-range chart's UCL. */
  movingRangeOutside: boolean;
}

/** Individuals and moving-range (I-MR) chart, Shewhart style. */
export interface IndividualsChart {
  method: 'Individuals and moving range (I-MR) chart, limits = mean ± 2.66 · mean moving range';
  centreLine: number;
  ucl: number;
  lcl: number;
  meanMovingRange: number;
  /** Moving-range chart: centre MR̄, UCL = 3.267 · MR̄, LCL = 0. */
  movingRangeUcl: number;
  /** Within-series sigma estimate MR̄ / d2. */
  sigmaWithin: number;
  points: ControlChartPoint[];
  /** Indices (0-based) of individual values outside the limits. */
  outOfControl: number[];
}

/**
 * Individuals control chart (Shewhart 1931; I-MR form as in ASTM/SPC practice): centre line
 * at the mean, limits at mean ± 2.66 · MR̄ where MR̄ is the mean of the moving ranges of
 * consecutive values. Values must be in time order.
 */
export function individualsChart(values: readonly number[]): IndividualsChart {
  assertFiniteValues(values, 'Control-chart values');
  if (values.length < 3) {
    throw new StatsInputError(
      'too-few-values',
      `An individuals chart needs at least three values in time order (got ${values.length}); add more results.`,
    );
  }
  const centreLine = mean(values);
  const ranges = values.slice(1).map((v, i) => Math.abs(v - values[i]));
  const meanMovingRange = mean(ranges);
  const ucl = centreLine + IMR_CONSTANTS.E2 * meanMovingRange;
  const lcl = centreLine - IMR_CONSTANTS.E2 * meanMovingRange;
  const movingRangeUcl = IMR_CONSTANTS.D4 * meanMovingRange;
  const points: ControlChartPoint[] = values.map((value, index) => {
    const movingRange = index === 0 ? null : ranges[index - 1];
    return {
      index,
      value,
      movingRange,
      outsideLimits: value > ucl || value < lcl,
      movingRangeOutside: movingRange !== null && movingRange > movingRangeUcl,
    };
  });
  return {
    method: 'Individuals and moving range (I-MR) chart, limits = mean ± 2.66 · mean moving range',
    centreLine,
    ucl,
    lcl,
    meanMovingRange,
    movingRangeUcl,
    sigmaWithin: meanMovingRange / IMR_CONSTANTS.d2,
    points,
    outOfControl: points.filter((p) => p.outsideLimits).map((p) => p.index),
  };
}
