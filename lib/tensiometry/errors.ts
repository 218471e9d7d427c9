import { CodedError } from '../coded-error';

/**
 * Thrown when a tensiometry calculation is handed input it cannot use (NaN, a negative plate
 * size, a temperature outside the formula's range, a force that no contact angle can explain).
 * The message says what to do.
 */
export class TensiometryInputError extends CodedError {
  // `code`: a short machine-readable reason, e.g. `out-of-range`, `not-finite`.
  override readonly name = 'TensiometryInputError';
}

export function requireFinite(value: number, label: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new TensiometryInputError('not-finite', `${label} is ${String(value)}; enter a number.`);
  }
  return value;
}

export function requirePositive(value: number, label: string, allowZero = false): number {
  requireFinite(value, label);
  if (value < 0 || (!allowZero && value === 0)) {
    throw new TensiometryInputError(
      'not-positive',
      `${label} is ${value}; it must be ${allowZero ? 'zero or positive' : 'positive'}.`,
    );
  }
  return value;
}
