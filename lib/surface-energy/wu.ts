import { SurfaceEnergyInputError } from './errors';
import type { AngleMeasurement, LiquidComponents } from './types';
import { assertMeasurements, assertSplitLiquid, toRadians } from './validate';
import { owrk } from './owrk';

export interface WuResult {
  method: 'Wu harmonic mean, two liquids';
  gammaDispersive: number;
  gammaPolar: number;
  gammaTotal: number;
  /** Other (γSd, γSp) pairs that also satisfy both equations; the harmonic-mean system can have two. */
  otherSolutions: { gammaDispersive: number; gammaPolar: number }[];
  warnings: string[];
}

/** The harmonic mean term 4·a·b/(a + b), taken as 0 when both are 0. */
function harmonic(a: number, b: number): number {
  return a + b > 0 ? (4 * a * b) / (a + b) : 0;
}

/** Largest γSd scanned when looking for roots, mN/m (far above any real solid). */
const MAX_DISPERSIVE = 200;
const SCAN_STEPS = 4000;

/**
 * Wu harmonic-mean surface free energy (Wu, J. Polym. Sci. C 34, 1971), two liquids:
 * γL(1 + cos θ) = 4·γSd γLd/(γSd + γLd) + 4·γSp γLp/(γSp + γLp), solved for (γSd, γSp).
 *
 * Solved by reduction to one unknown: for each γSd the more polar liquid's equation gives γSp
 * in closed form; the other liquid's equation is then a residual in γSd alone, scanned on
 * (0, 200] mN/m and each sign change bisected. Where two pairs satisfy both equations, the one
 * nearest the OWRK result of the same liquids is returned and the other listed.
 */
export function wu(measurements: readonly AngleMeasurement[]): WuResult {
  assertMeasurements(measurements, 2, "Wu's harmonic-mean method");
  if (measurements.length !== 2) {
    throw new SurfaceEnergyInputError(
      'wrong-liquid-count',
      `Wu's harmonic-mean method takes exactly two liquids (got ${measurements.length}); choose one polar and one apolar liquid, or use OWRK for more.`,
    );
  }
  measurements.forEach((m) => assertSplitLiquid(m.liquid));
  const [a, b] = measurements;
  const polarFirst = a.liquid.gammaPolar >= b.liquid.gammaPolar;
  const P = polarFirst ? a : b;
  const Q = polarFirst ? b : a;
  if (!(P.liquid.gammaPolar > 0)) {
    throw new SurfaceEnergyInputError(
      'degenerate',
      'Both liquids are apolar, so the polar component cannot be found. Use one polar liquid (e.g. water) with an apolar one.',
    );
  }
  const lhs = (m: AngleMeasurement) => m.liquid.gammaTotal * (1 + Math.cos(toRadians(m.angleDeg)));
  const lhsP = lhs(P);
  const lhsQ = lhs(Q);
  const Pl: LiquidComponents = P.liquid;
  const Ql: LiquidComponents = Q.liquid;
  if (
    Math.abs(Pl.gammaDispersive * Ql.gammaPolar - Pl.gammaPolar * Ql.gammaDispersive) <
    1e-9 * Pl.gammaTotal * Ql.gammaTotal
  ) {
    throw new SurfaceEnergyInputError(
      'degenerate',
      'The two liquids have the same polar-to-dispersive ratio, so the components cannot be separated. Use liquids of different polarity.',
    );
  }
  // γSp from liquid P's equation for a given γSd, or null where none ≥ 0 exists.
  const polarFromP = (d: number): number | null => {
    const h = lhsP - harmonic(d, Pl.gammaDispersive);
    if (h < 0 || h >= 4 * Pl.gammaPolar) return null;
    return (h * Pl.gammaPolar) / (4 * Pl.gammaPolar - h);
  };
  const residual = (d: number): number | null => {
    const p = polarFromP(d);
    if (p === null) return null;
    return lhsQ - harmonic(d, Ql.gammaDispersive) - harmonic(p, Ql.gammaPolar);
  };
  const roots: { gammaDispersive: number; gammaPolar: number }[] = [];
  let prevD = 0;
  let prevR = residual(0);
  for (let i = 1; i <= SCAN_STEPS; i++) {
    const d = (MAX_DISPERSIVE * i) / SCAN_STEPS;
    const r = residual(d);
    if (prevR !== null && r !== null && (prevR === 0 || prevR * r < 0)) {
      let lo = prevD;
      let hi = d;
      let rLo = prevR;
      for (let k = 0; k < 100 && hi - lo > 1e-13 * Math.max(1, hi); k++) {
        const mid = (lo + hi) / 2;
        const rMid = residual(mid);
        if (rMid === null) break;
        if (rLo * rMid <= 0) hi = mid;
        else {
          lo = mid;
          rLo = rMid;
        }
      }
      const root = (lo + hi) / 2;
      const polar = polarFromP(root);
      if (polar !== null) roots.push({ gammaDispersive: root, gammaPolar: polar });
    }
    prevD = d;
    prevR = r;
  }
  if (roots.length === 0) {
    throw new SurfaceEnergyInputError(
      'no-solution',
      "Wu's equations have no solution with non-negative components for these angles. Check the angles and the liquids' values, or use OWRK.",
    );
  }
  const warnings: string[] = [];
  let best = roots[0];
  if (roots.length > 1) {
    let reference: { gammaDispersive: number; gammaPolar: number } | null = null;
    try {
      reference = owrk(measurements);
    } catch {
      reference = null;
    }
    if (reference) {
      const ref = reference;
      const dist = (r: { gammaDispersive: number; gammaPolar: number }) =>
        Math.hypot(r.gammaDispersive - ref.gammaDispersive, r.gammaPolar - ref.gammaPolar);
      best = roots.reduce((x, y) => (dist(y) < dist(x) ? y : x));
    }
    warnings.push(
      `The harmonic-mean equations have ${roots.length} solutions; the one nearest the OWRK result is reported, the others are listed.`,
    );
  }
  return {
    method: 'Wu harmonic mean, two liquids',
    gammaDispersive: best.gammaDispersive,
    gammaPolar: best.gammaPolar,
    gammaTotal: best.gammaDispersive + best.gammaPolar,
    otherSolutions: roots.filter((r) => r !== best),
    warnings,
  };
}
