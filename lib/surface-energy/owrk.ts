import { SurfaceEnergyInputError } from './errors';
import type { AngleMeasurement, LiquidComponents, SolidComponents } from './types';
import {
  assertMeasurements,
  assertSplitLiquid,
  fitLine,
  isDegenerateSpread,
  toRadians,
} from './validate';

export interface OwrkPoint {
  liquid: string;
  /** √(γLp/γLd) */
  x: number;
  /** γL(1 + cos θ) / (2√γLd) */
  y: number;
  /** intercept + slope·x */
  fittedY: number;
}

export interface OwrkResult {
  method: 'OWRK (Owens–Wendt–Rabel–Kaelble), geometric mean, least squares';
  gammaDispersive: number;
  gammaPolar: number;
  gammaTotal: number;
  /** √γSp */
  slope: number;
  /** √γSd */
  intercept: number;
  /** Coefficient of determination of the line (1 by construction with two liquids). */
  rSquared: number;
  /** Regression points for a plot of y against x. */
  points: OwrkPoint[];
  warnings: string[];
}

/**
 * Owens–Wendt–Rabel–Kaelble surface free energy (Owens & Wendt, J. Appl. Polym. Sci. 13,
 * 1969; Kaelble, J. Adhesion 2, 1970; Rabel, Farbe und Lack 77, 1971). With the geometric-mean
 * combining rule γL(1 + cos θ) = 2(√(γSd γLd) + √(γSp γLp)), each liquid gives a point
 * x = √(γLp/γLd), y = γL(1 + cos θ)/(2√γLd) on the line y = √γSp·x + √γSd; a least-squares
 * line through two or more liquids gives γSp = slope², γSd = intercept².
 */
export function owrk(measurements: readonly AngleMeasurement[]): OwrkResult {
  assertMeasurements(measurements, 2, 'OWRK');
  measurements.forEach((m) => {
    assertSplitLiquid(m.liquid);
    if (!(m.liquid.gammaDispersive > 0)) {
      throw new SurfaceEnergyInputError(
        'no-dispersive-component',
        `Liquid "${m.liquid.name}" has no dispersive component; OWRK divides by it. Use liquids with γLd > 0.`,
      );
    }
  });
  const xs = measurements.map((m) => Math.sqrt(m.liquid.gammaPolar / m.liquid.gammaDispersive));
  const ys = measurements.map(
    (m) =>
      (m.liquid.gammaTotal * (1 + Math.cos(toRadians(m.angleDeg)))) /
      (2 * Math.sqrt(m.liquid.gammaDispersive)),
  );
  if (isDegenerateSpread(xs)) {
    throw new SurfaceEnergyInputError(
      'degenerate',
      'All liquids have the same polar-to-dispersive ratio, so OWRK cannot separate the components. Add a liquid of different polarity (e.g. water with diiodomethane).',
    );
  }
  const { slope, intercept, rSquared } = fitLine(xs, ys);
  const warnings: string[] = [];
  let gammaPolar = slope * slope;
  let gammaDispersive = intercept * intercept;
  if (slope < 0) {
    warnings.push(
      'The fitted slope is negative (no real polar component); the polar component is set to 0. Check the angles and liquids.',
    );
    gammaPolar = 0;
  }
  if (intercept < 0) {
    warnings.push(
      'The fitted intercept is negative (no real dispersive component); the dispersive component is set to 0. Check the angles and liquids.',
    );
    gammaDispersive = 0;
  }
  if (measurements.length === 2)
    warnings.push(
      'Two liquids: the line passes through both points exactly, so R² carries no information.',
    );
  if (!measurements.some((m) => m.liquid.gammaPolar === 0)) {
    warnings.push(
      'No apolar liquid (such as diiodomethane) in the set; the dispersive component is poorly fixed.',
    );
  }
  return {
    method: 'OWRK (Owens–Wendt–Rabel–Kaelble), geometric mean, least squares',
    gammaDispersive,
    gammaPolar,
    gammaTotal: gammaDispersive + gammaPolar,
    slope,
    intercept,
    rSquared,
    points: measurements.map((m, i) => ({
      liquid: m.liquid.name,
      x: xs[i],
      y: ys[i],
      fittedY: intercept + slope * xs[i],
    })),
    warnings,
  };
}

/**
 * Contact angle a liquid would show on a solid by the OWRK (geometric-mean) relation:
 * cos θ = 2(√(γSd γLd) + √(γSp γLp))/γL − 1; 0° where the liquid would spread (cos θ ≥ 1)
 * and 180° where cos θ ≤ −1.
 */
export function predictAngleOwrk(solid: SolidComponents, liquid: LiquidComponents): number {
  const cos =
    (2 *
      (Math.sqrt(solid.gammaDispersive * liquid.gammaDispersive) +
        Math.sqrt(solid.gammaPolar * liquid.gammaPolar))) /
      liquid.gammaTotal -
    1;
  if (cos >= 1) return 0;
  if (cos <= -1) return 180;
  return (Math.acos(cos) * 180) / Math.PI;
}
