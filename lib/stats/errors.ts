import { CodedError } from '../coded-error';

/**
 * Thrown when the statistics functions are handed input they cannot use (too few values,
 * NaN, an impossible confidence level, …). The message says what was wrong and what to do.
 */
export class StatsInputError extends CodedError {
  // `code`: a short machine-readable reason, e.g. `too-few-values`, `not-finite`.
  override readonly name = 'StatsInputError';
}

/** Throws unless every value is a finite number. `what` names the data in the message. */
export function assertFiniteValues(values: readonly number[], what: string): void {
  if (!Array.isArray(values)) {
    throw new StatsInputError('not-an-array', `${what} must be a list of numbers.`);
  }
  values.forEach((v, i) => {
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new StatsInputError(
        'not-finite',
        `${what}: value #${i + 1} is ${String(v)}, not a finite number. Remove or correct it and try again.`,
      );
    }
  });
}

/** Throws unless 0 < level < 1. */
export function assertConfidenceLevel(level: number): void {
  if (!Number.isFinite(level) || level <= 0 || level >= 1) {
    throw new StatsInputError(
      'bad-confidence-level',
      `Confidence level must be a fraction between 0 and 1 (e.g. 0.95), got ${String(level)}.`,
    );
  }
}
