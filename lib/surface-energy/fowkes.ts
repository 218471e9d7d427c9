import { SurfaceEnergyInputError } from './errors';
import type { AngleMeasurement } from './types';
import { assertAngle, assertSplitLiquid, toRadians } from './validate';

export interface FowkesResult {
  method: 'Fowkes, dispersive component from one apolar liquid';
  gammaDispersive: number;
}

/**
 * Dispersive surface free energy from one apolar liquid (Fowkes, Ind. Eng. Chem. 56, 1964):
 * γL(1 + cos θ) = 2√(γSd γLd) ⇒ γSd = γL²(1 + cos θ)²/(4γLd). The liquid must be apolar
 * (polar component at most 0.5 mN/m), e.g. diiodomethane.
 */
export function fowkes(measurement: AngleMeasurement): FowkesResult {
  if (!measurement || typeof measurement !== 'object') {
    throw new SurfaceEnergyInputError(
      'too-few-liquids',
      'Fowkes needs one measurement with an apolar liquid such as diiodomethane.',
    );
  }
  const { liquid, angleDeg } = measurement;
  assertAngle(angleDeg, `Liquid "${liquid?.name ?? '?'}"`);
  assertSplitLiquid(liquid);
  if (liquid.gammaPolar > 0.5 || !(liquid.gammaDispersive > 0)) {
    throw new SurfaceEnergyInputError(
      'not-apolar',
      `Fowkes' dispersive-only method needs an apolar liquid; "${liquid.name}" has a polar component of ${liquid.gammaPolar} mN/m. Use diiodomethane or another apolar liquid.`,
    );
  }
  const k = liquid.gammaTotal * (1 + Math.cos(toRadians(angleDeg)));
  return {
    method: 'Fowkes, dispersive component from one apolar liquid',
    gammaDispersive: (k * k) / (4 * liquid.gammaDispersive),
  };
}
