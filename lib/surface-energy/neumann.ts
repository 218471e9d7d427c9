import type { AngleMeasurement } from './types';
import { assertAngle, assertTension, toRadians } from './validate';

/** β of the Kwok–Neumann equation of state, (m²/mJ)², as published (0.0001247). */
export const NEUMANN_BETA = 0.0001247;

export interface NeumannResult {
  method: 'Neumann equation of state (Kwok & Neumann 1999)';
  /** Solid surface tension γS, mN/m. */
  gammaSolid: number;
  beta: number;
}

/** cos θ predicted by the Kwok–Neumann equation of state for solid γS and liquid γL. */
export function neumannCosTheta(
  gammaSolid: number,
  gammaLiquid: number,
  beta = NEUMANN_BETA,
): number {
  return (
    -1 + 2 * Math.sqrt(gammaSolid / gammaLiquid) * Math.exp(-beta * (gammaLiquid - gammaSolid) ** 2)
  );
}

/**
 * Solid surface tension from one liquid by the equation of state of Kwok & Neumann (Adv.
 * Colloid Interface Sci. 81, 1999): cos θ = −1 + 2√(γS/γL)·exp(−β(γL − γS)²),
 * β = 0.0001247 (m²/mJ)². The right side rises monotonically from −1 at γS = 0 to +1 at
 * γS = γL, so γS is found by bisection on (0, γL]; θ = 0 returns γS = γL (lower bound).
 */
export function neumann(measurement: AngleMeasurement): NeumannResult {
  const { liquid, angleDeg } = measurement;
  assertAngle(angleDeg, `Liquid "${liquid?.name ?? '?'}"`);
  const gammaL = assertTension(
    liquid.gammaTotal,
    'total surface tension',
    `Liquid "${liquid.name}"`,
    false,
  );
  const target = Math.cos(toRadians(angleDeg));
  let lo = 0;
  let hi = gammaL;
  for (let i = 0; i < 200 && hi - lo > 1e-13 * gammaL; i++) {
    const mid = (lo + hi) / 2;
    if (neumannCosTheta(mid, gammaL) < target) lo = mid;
    else hi = mid;
  }
  return {
    method: 'Neumann equation of state (Kwok & Neumann 1999)',
    gammaSolid: (lo + hi) / 2,
    beta: NEUMANN_BETA,
  };
}
