import { SurfaceEnergyInputError } from './errors';
import type { SolidComponents } from './types';
import { assertAngle, assertTension, toRadians } from './validate';

export interface WettingEnvelope {
  method: 'Wetting envelope, OWRK geometric-mean relation';
  angleDeg: number;
  /**
   * Closed curve of liquid components (dispersive on x, polar on y, mN/m) that would show
   * exactly `angleDeg` on the solid; it starts and ends at the origin. Liquids inside wet the
   * solid at a smaller angle.
   */
  points: { gammaDispersive: number; gammaPolar: number }[];
}

/**
 * Wetting envelope of a solid, the usual plot of an OWRK result: the liquids
 * (γLd, γLp) satisfying γL(1 + cos θ) = 2(√(γSd γLd) + √(γSp γLp)) for a chosen θ (0° by
 * default). With γLd = r cos φ, γLp = r sin φ this gives, for each direction φ ∈ [0°, 90°],
 * √r = 2(√(γSd cos φ) + √(γSp sin φ)) / ((cos φ + sin φ)(1 + cos θ)).
 */
export function wettingEnvelope(
  solid: SolidComponents,
  options: { angleDeg?: number; steps?: number } = {},
): WettingEnvelope {
  const angleDeg = options.angleDeg ?? 0;
  const steps = options.steps ?? 90;
  assertAngle(angleDeg, 'Wetting envelope');
  if (angleDeg >= 180) {
    throw new SurfaceEnergyInputError(
      'angle-out-of-range',
      'The wetting envelope needs an angle below 180°.',
    );
  }
  assertTension(solid.gammaDispersive, 'dispersive component', 'Solid');
  assertTension(solid.gammaPolar, 'polar component', 'Solid');
  if (!(solid.gammaDispersive + solid.gammaPolar > 0)) {
    throw new SurfaceEnergyInputError(
      'degenerate',
      'The solid has no surface energy; compute its components first.',
    );
  }
  if (!Number.isInteger(steps) || steps < 2) {
    throw new SurfaceEnergyInputError('bad-parameter', 'The envelope needs at least 2 steps.');
  }
  const k = 1 + Math.cos(toRadians(angleDeg));
  const points: { gammaDispersive: number; gammaPolar: number }[] = [
    { gammaDispersive: 0, gammaPolar: 0 },
  ];
  for (let i = 0; i <= steps; i++) {
    const phi = (Math.PI / 2) * (i / steps);
    // Exact ends, so the curve meets the axes exactly.
    const c = i === steps ? 0 : Math.cos(phi);
    const s = i === 0 ? 0 : Math.sin(phi);
    const root =
      (2 * (Math.sqrt(solid.gammaDispersive * c) + Math.sqrt(solid.gammaPolar * s))) /
      ((c + s) * k);
    const r = root * root;
    points.push({ gammaDispersive: r * c, gammaPolar: r * s });
  }
  points.push({ gammaDispersive: 0, gammaPolar: 0 });
  return { method: 'Wetting envelope, OWRK geometric-mean relation', angleDeg, points };
}
