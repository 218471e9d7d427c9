import { CodedError } from '../coded-error';

/**
 * Thrown when a surface-energy calculation is handed input it cannot use: NaN, a negative
 * surface tension, an angle outside 0–180°, too few liquids, or liquids that cannot separate
 * the components (collinear or degenerate data). The message says what to do.
 */
export class SurfaceEnergyInputError extends CodedError {
  // `code`: a short machine-readable reason, e.g. `too-few-liquids`, `degenerate`.
  override readonly name = 'SurfaceEnergyInputError';
}
