import { SurfaceEnergyInputError } from './errors';
import type { AngleMeasurement, LiquidComponents } from './types';

const DEG = Math.PI / 180;

export function toRadians(deg: number): number {
  return deg * DEG;
}

export function assertAngle(angleDeg: number, where: string): void {
  if (typeof angleDeg !== 'number' || !Number.isFinite(angleDeg)) {
    throw new SurfaceEnergyInputError(
      'not-finite',
      `${where}: the contact angle is ${String(angleDeg)}; enter a number of degrees.`,
    );
  }
  if (angleDeg < 0 || angleDeg > 180) {
    throw new SurfaceEnergyInputError(
      'angle-out-of-range',
      `${where}: contact angle ${angleDeg}° is outside 0–180°; check the measurement.`,
    );
  }
}

export function assertTension(
  value: number | undefined,
  label: string,
  where: string,
  allowZero = true,
): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new SurfaceEnergyInputError(
      'not-finite',
      `${where}: ${label} is ${String(value)}; enter a value in mN/m.`,
    );
  }
  if (value < 0 || (!allowZero && value === 0)) {
    throw new SurfaceEnergyInputError(
      'negative-tension',
      `${where}: ${label} is ${value} mN/m; surface tensions and their components must be ${allowZero ? 'zero or positive' : 'positive'}.`,
    );
  }
  return value;
}

/** Checks total, dispersive and polar of a liquid; components must add up to the total within 0.5 mN/m. */
export function assertSplitLiquid(liquid: LiquidComponents): void {
  const where = `Liquid "${liquid?.name ?? '?'}"`;
  const total = assertTension(liquid.gammaTotal, 'total surface tension', where, false);
  const d = assertTension(liquid.gammaDispersive, 'dispersive component', where);
  const p = assertTension(liquid.gammaPolar, 'polar component', where);
  if (Math.abs(d + p - total) > 0.5) {
    throw new SurfaceEnergyInputError(
      'components-mismatch',
      `${where}: dispersive (${d}) + polar (${p}) should equal the total (${total}) mN/m; correct the liquid's values.`,
    );
  }
}

export function assertMeasurements(
  measurements: readonly AngleMeasurement[],
  min: number,
  method: string,
): void {
  if (!Array.isArray(measurements) || measurements.length < min) {
    throw new SurfaceEnergyInputError(
      'too-few-liquids',
      `${method} needs at least ${min} probe liquid${min === 1 ? '' : 's'} (got ${Array.isArray(measurements) ? measurements.length : 0}); measure another liquid.`,
    );
  }
  measurements.forEach((m) => assertAngle(m.angleDeg, `Liquid "${m.liquid?.name ?? '?'}"`));
}

/** Ordinary least-squares line y = intercept + slope·x with R². */
export function fitLine(
  xs: readonly number[],
  ys: readonly number[],
): { slope: number; intercept: number; rSquared: number } {
  const n = xs.length;
  const mx = xs.reduce((a, b) => a + b, 0) / n;
  const my = ys.reduce((a, b) => a + b, 0) / n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (xs[i] - mx) ** 2;
    sxy += (xs[i] - mx) * (ys[i] - my);
    syy += (ys[i] - my) ** 2;
  }
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  let sse = 0;
  for (let i = 0; i < n; i++) sse += (ys[i] - intercept - slope * xs[i]) ** 2;
  const rSquared = syy > 0 ? 1 - sse / syy : 1;
  return { slope, intercept, rSquared };
}

/** Relative spread of xs; below ~1e-9 the values are taken as identical. */
export function isDegenerateSpread(xs: readonly number[]): boolean {
  const max = Math.max(...xs);
  const min = Math.min(...xs);
  return !(max - min > 1e-9 * Math.max(1, Math.abs(max)));
}
