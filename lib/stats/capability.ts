import { StatsInputError, assertFiniteValues } from './errors';
import { mean, sumOfSquaredDeviations } from './describe';
import { IMR_CONSTANTS } from './control-chart';

/** Specification limits; either or both may be given (contact angle ≥ 100° has only a lower one). */
export interface SpecLimits {
  lower?: number;
  upper?: number;
}

export type SigmaMethod = 'sample-sd' | 'moving-range';

export interface CapabilityResult {
  n: number;
  mean: number;
  sigma: number;
  /** How sigma was estimated, in words. */
  sigmaMethod: string;
  /** (USL − LSL) / 6σ; null unless both limits are given. */
  cp: number | null;
  /** (USL − mean) / 3σ; null without an upper limit. */
  cpu: number | null;
  /** (mean − LSL) / 3σ; null without a lower limit. */
  cpl: number | null;
  /** min(cpu, cpl) of the limits that exist. */
  cpk: number;
  /** Which formula produced cpk, in words. */
  rule: string;
}

/**
 * Process capability against specification limits (Kane, "Process capability indices",
 * J. Quality Technology 1986): Cp = (USL − LSL)/6σ, Cpk = min(USL − μ, μ − LSL)/3σ; with a
 * single limit only the one-sided index exists (Cpl or Cpu) and Cpk equals it.
 *
 * σ is the sample SD of all values by default (strictly this makes the indices Pp/Ppk, the
 * "overall" performance form); pass `sigmaMethod: 'moving-range'` for the within estimate
 * MR̄/d2 of consecutive values (values then must be in time order).
 */
export function capability(
  values: readonly number[],
  limits: SpecLimits,
  options: { sigmaMethod?: SigmaMethod } = {},
): CapabilityResult {
  assertFiniteValues(values, 'Capability values');
  const { lower, upper } = limits;
  if (lower === undefined && upper === undefined) {
    throw new StatsInputError(
      'no-limits',
      'Capability needs at least one specification limit (a minimum or a maximum).',
    );
  }
  for (const [name, v] of [
    ['Lower limit', lower],
    ['Upper limit', upper],
  ] as const) {
    if (v !== undefined && !Number.isFinite(v)) {
      throw new StatsInputError(
        'not-finite',
        `${name} is ${String(v)}; enter a number or leave it empty.`,
      );
    }
  }
  if (lower !== undefined && upper !== undefined && lower >= upper) {
    throw new StatsInputError(
      'bad-limits',
      `The lower limit (${lower}) must be below the upper limit (${upper}).`,
    );
  }
  if (values.length < 2) {
    throw new StatsInputError(
      'too-few-values',
      'Capability needs at least two values (many more for a meaningful index).',
    );
  }
  const method = options.sigmaMethod ?? 'sample-sd';
  const m = mean(values);
  let sigma: number;
  let sigmaMethod: string;
  if (method === 'moving-range') {
    const ranges = values.slice(1).map((v, i) => Math.abs(v - values[i]));
    sigma = mean(ranges) / IMR_CONSTANTS.d2;
    sigmaMethod = 'within: mean moving range / d2 (d2 = 1.128)';
  } else {
    sigma = Math.sqrt(sumOfSquaredDeviations(values, m) / (values.length - 1));
    sigmaMethod = 'overall: sample standard deviation (n − 1)';
  }
  if (!(sigma > 0)) {
    throw new StatsInputError(
      'zero-variance',
      'The values have no spread, so capability indices are infinite. Check the data.',
    );
  }
  const cp = lower !== undefined && upper !== undefined ? (upper - lower) / (6 * sigma) : null;
  const cpu = upper !== undefined ? (upper - m) / (3 * sigma) : null;
  const cpl = lower !== undefined ? (m - lower) / (3 * sigma) : null;
  let cpk: number;
  let rule: string;
  if (cpu !== null && cpl !== null) {
    cpk = Math.min(cpu, cpl);
    rule = 'Cpk = min(USL − mean, mean − LSL) / 3σ';
  } else if (cpl !== null) {
    cpk = cpl;
    rule = 'one-sided, lower limit only: Cpk = Cpl = (mean − LSL) / 3σ';
  } else {
    cpk = cpu as number;
    rule = 'one-sided, upper limit only: Cpk = Cpu = (USL − mean) / 3σ';
  }
  return { n: values.length, mean: m, sigma, sigmaMethod, cp, cpu, cpl, cpk, rule };
}
