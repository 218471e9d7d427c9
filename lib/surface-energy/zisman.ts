import { SurfaceEnergyInputError } from './errors';
import type { AngleMeasurement } from './types';
import {
  assertMeasurements,
  assertTension,
  fitLine,
  isDegenerateSpread,
  toRadians,
} from './validate';

export interface ZismanResult {
  method: 'Zisman critical surface tension (cos θ against γL, extrapolated to cos θ = 1)';
  /** Critical surface tension γc, mN/m. */
  criticalSurfaceTension: number;
  /** cos θ = intercept + slope·γL */
  slope: number;
  intercept: number;
  rSquared: number;
  points: { liquid: string; gammaL: number; cosTheta: number; fittedCosTheta: number }[];
  warnings: string[];
}

/**
 * Zisman critical surface tension (Zisman, "Relation of the equilibrium contact angle to
 * liquid and solid constitution", Adv. Chem. Ser. 43, 1964): a straight line of cos θ against
 * the liquids' total tension γL, extrapolated to cos θ = 1, gives γc = (1 − intercept)/slope.
 * Meant for a homologous series of liquids; use at least three.
 */
export function zisman(measurements: readonly AngleMeasurement[]): ZismanResult {
  assertMeasurements(measurements, 2, 'Zisman');
  const gammas = measurements.map((m) =>
    assertTension(m.liquid.gammaTotal, 'total surface tension', `Liquid "${m.liquid.name}"`, false),
  );
  const cosines = measurements.map((m) => Math.cos(toRadians(m.angleDeg)));
  if (isDegenerateSpread(gammas)) {
    throw new SurfaceEnergyInputError(
      'degenerate',
      'All liquids have the same surface tension, so no line can be drawn. Use liquids covering a range of tensions.',
    );
  }
  const { slope, intercept, rSquared } = fitLine(gammas, cosines);
  if (!(slope < 0)) {
    throw new SurfaceEnergyInputError(
      'degenerate',
      'cos θ does not fall as the liquid tension rises, so the line cannot be extrapolated to cos θ = 1. Check the angles and liquids.',
    );
  }
  const warnings: string[] = [];
  if (measurements.length < 3)
    warnings.push('Only two liquids: the Zisman line is fixed by them alone; use three or more.');
  if (measurements.some((m) => m.angleDeg === 0)) {
    warnings.push(
      'A liquid at 0° (spreading) is in the fit; common practice leaves spreading liquids out.',
    );
  }
  return {
    method: 'Zisman critical surface tension (cos θ against γL, extrapolated to cos θ = 1)',
    criticalSurfaceTension: (1 - intercept) / slope,
    slope,
    intercept,
    rSquared,
    points: measurements.map((m, i) => ({
      liquid: m.liquid.name,
      gammaL: gammas[i],
      cosTheta: cosines[i],
      fittedCosTheta: intercept + slope * gammas[i],
    })),
    warnings,
  };
}
