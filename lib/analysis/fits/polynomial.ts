/**
 * Polynomial tangent fit: on each side, the profile points within a short arc of the contact point
 * are fitted by a quadratic n = c₀ + c₁ s + c₂ s² in a local frame whose s axis follows the
 * expected tangent there (from a first circle fit). In that frame the profile stays single-valued
 * for any angle, also near and beyond 90°, unlike y(x) or x(y) fits. The contact point is where the
 * polynomial meets the baseline; the angle is that of its tangent there.
 */
import { polynomialLeastSquares } from './least-squares';
import { circleAngles, fitWholeCircle } from './circle';
import { DEG } from './types';
import type { ContactAngles, DropShape, FramePoints, ProfileFit, ProfileFitter } from './types';
import { DEFAULT_SETTINGS, type AnalysisSettings } from '../settings';

const DEGREE = 2;
/**
 * Above `polynomialQuarticAboveDeg` (settings; 140°) the the visible profile starts a long arc (margin / sin θ) above the contact point
 * and the tangent is extrapolated over that arc, where a quadratic's truncation shows (0.02° at
 * 150°, 0.26° at 170° on exact points 3 px above the baseline). On (nearly) noise-free points a
 * quartic follows the curvature there (0.0003° at 150°, 0.007° at 170°); with photo-level edge
 * scatter its noise is far worse than the quadratic's bias (measured on the generated photos:
 * 7–30° instead of 2–3° at 130°–150°), so it is only used below `polynomialQuarticMaxScatterPx`
 * (0.01 px, the residual SD of a quartic over the long window).
 */
const QUARTIC_DEGREE = 4;
/** Weight of the truncation term in the window choice (see fitSide). */
const TRUNCATION_WEIGHT = 0.04;

interface SideFrame {
  side: -1 | 1;
  /** The polynomial's degree and the arc length (px) of its window. */
  degree: number;
  length: number;
  /** Origin on the baseline (u, 0) and the local axes. */
  origin: number;
  e1: [number, number];
  e2: [number, number];
  s: Float64Array;
  n: Float64Array;
}

function polyValue(c: readonly number[], s: number): number {
  let value = 0;
  for (let k = c.length - 1; k >= 0; k--) value = value * s + c[k];
  return value;
}

function polySlope(c: readonly number[], s: number): number {
  let value = 0;
  for (let k = c.length - 1; k >= 1; k--) value = value * s + k * c[k];
  return value;
}

/** Contact (s where the curve meets v = baselineV, default the baseline) and the angle there. */
function sideAngle(
  frame: SideFrame,
  c: readonly number[],
  baselineV = 0,
): { angleDeg: number; u: number } {
  const [e1u, e1v] = frame.e1;
  const [e2u, e2v] = frame.e2;
  let s = 0;
  for (let k = 0; k < 30; k++) {
    const g = s * e1v + polyValue(c, s) * e2v - baselineV;
    const dg = e1v + polySlope(c, s) * e2v;
    if (Math.abs(dg) < 1e-12) break;
    const step = g / dg;
    s -= step;
    if (Math.abs(step) < 1e-10) break;
  }
  const slope = polySlope(c, s);
  // Tangent along increasing s, i.e. up the profile; beyond 180° or below 0° it is clamped.
  const tu = e1u + slope * e2u;
  const tv = e1v + slope * e2v;
  let angle = Math.atan2(tv, frame.side < 0 ? tu : -tu) * DEG;
  if (angle < -90) angle = 180;
  return {
    angleDeg: Math.min(180, Math.max(0, angle)),
    u: frame.origin + s * e1u + polyValue(c, s) * e2u,
  };
}

export class PolynomialFit implements ProfileFit {
  readonly method = 'polynomial' as const;
  readonly parameterNames: readonly string[];
  readonly parameters: readonly number[];
  readonly parameterSteps: readonly number[];
  readonly converged = true;
  private readonly leftCount: number;
  constructor(
    readonly frames: [SideFrame, SideFrame],
    left: number[],
    right: number[],
    private readonly heightPx: number,
  ) {
    this.leftCount = left.length;
    this.parameters = [...left, ...right];
    this.parameterNames = [
      ...left.map((_, k) => `leftC${k}`),
      ...right.map((_, k) => `rightC${k}`),
    ];
    this.parameterSteps = this.parameters.map((p) => 1e-6 * Math.max(Math.abs(p), 1e-3));
  }
  private split(p: readonly number[]): [readonly number[], readonly number[]] {
    return [p.slice(0, this.leftCount), p.slice(this.leftCount)];
  }
  residuals(p: readonly number[] = this.parameters): Float64Array {
    const coefficients = this.split(p);
    const out: number[] = [];
    this.frames.forEach((frame, k) => {
      for (let i = 0; i < frame.s.length; i++)
        out.push(frame.n[i] - polyValue(coefficients[k], frame.s[i]));
    });
    return Float64Array.from(out);
  }
  angles(p: readonly number[] = this.parameters, baselineV = 0): ContactAngles {
    const [cl, cr] = this.split(p);
    const left = sideAngle(this.frames[0], cl, baselineV);
    const right = sideAngle(this.frames[1], cr, baselineV);
    return { leftDeg: left.angleDeg, rightDeg: right.angleDeg, leftU: left.u, rightU: right.u };
  }
  shape(): DropShape {
    return {
      heightPx: this.heightPx,
      apexRadiusPx: null,
      bond: null,
      volumePx3: null,
      surfaceAreaPx2: null,
    };
  }
}

/**
 * One side. The arc length L balances truncation against noise: a quadratic's slope error grows
 * as (L/R)³ on a circle of radius R, the noise error about as 10 σ / L^1.5 for points one pixel
 * apart with scatter σ (least-squares slope at the window end). σ comes from a fit over a long
 * window; exact data thus gets a short window, noisy data a long one. The truncation weight,
 * TRUNCATION_WEIGHT (L/R)³, was 0.12 as measured on exact arcs; on the generated photos, where the
 * edge noise is correlated along the outline and so costs more than the model assumes, 0.04 gives
 * longer windows and about a third less error (per-side MAE 0.45° → 0.29° over 30°–130°, β 0–0.5,
 * level and tilted stages).
 */
function fitSide(
  points: FramePoints,
  side: -1 | 1,
  startU: number,
  startTheta: number,
  radius: number,
  lowestV: number,
  settings: AnalysisSettings,
) {
  const minLength = lowestV / Math.max(Math.sin(startTheta), 0.1) + 6;
  // A quartic over the long window leaves mostly noise in its residuals.
  const longest = fitWindow(
    points,
    side,
    startU,
    startTheta,
    Math.max(0.33 * radius, minLength + 10),
    4,
  );
  if (!longest) throw new Error('Too few edge points near a contact point for the polynomial fit.');
  const sigma = longest.residualSd;
  let bestLength = minLength;
  let bestError = Infinity;
  for (let length = minLength; length <= 0.33 * radius + 1e-9; length *= 1.08) {
    const bias = TRUNCATION_WEIGHT * (length / radius) ** 3;
    const noise = (10 * sigma) / length ** 1.5;
    const error = Math.hypot(bias, noise);
    if (error < bestError) {
      bestError = error;
      bestLength = length;
    }
  }
  const degree =
    startTheta * DEG > settings.polynomialQuarticAboveDeg &&
    sigma < settings.polynomialQuarticMaxScatterPx
      ? QUARTIC_DEGREE
      : DEGREE;
  let chosen = fitWindow(points, side, startU, startTheta, bestLength, degree);
  // Too few points in a very short window: lengthen it until the fit is determined.
  for (let length = bestLength * 1.2; !chosen && length <= 0.5 * radius; length *= 1.2) {
    chosen = fitWindow(points, side, startU, startTheta, length, degree);
  }
  if (!chosen) throw new Error('Too few edge points near a contact point for the polynomial fit.');
  return chosen;
}

function fitWindow(
  points: FramePoints,
  side: -1 | 1,
  startU: number,
  startTheta: number,
  length: number,
  degree = DEGREE,
) {
  let origin = startU;
  let angle = startTheta;
  let result: {
    frame: SideFrame;
    coefficients: number[];
    angle: number;
    residualSd: number;
  } | null = null;
  // Re-centre the frame on the found contact point and tangent once.
  for (let pass = 0; pass < 2; pass++) {
    const e1: [number, number] =
      side < 0 ? [Math.cos(angle), Math.sin(angle)] : [-Math.cos(angle), Math.sin(angle)];
    const e2: [number, number] = [-e1[1], e1[0]];
    const s: number[] = [];
    const n: number[] = [];
    for (let i = 0; i < points.u.length; i++) {
      if (points.side[i] !== side) continue;
      const du = points.u[i] - origin;
      const dv = points.v[i];
      if (Math.hypot(du, dv) > length) continue;
      s.push(du * e1[0] + dv * e1[1]);
      n.push(du * e2[0] + dv * e2[1]);
    }
    if (s.length < degree + 6) return result;
    const fit = polynomialLeastSquares(s, n, degree);
    const frame: SideFrame = {
      side,
      degree,
      length,
      origin,
      e1,
      e2,
      s: Float64Array.from(s),
      n: Float64Array.from(n),
    };
    const found = sideAngle(frame, fit.coefficients);
    if (!Number.isFinite(found.u) || !Number.isFinite(found.angleDeg)) return result;
    result = {
      frame,
      coefficients: fit.coefficients,
      angle: found.angleDeg,
      residualSd: fit.residualSd,
    };
    origin = found.u;
    angle = Math.min(Math.max(found.angleDeg, 1), 179) / DEG;
  }
  return result;
}

/**
 * `sameAs` (a polynomial fit of the same drop) fixes each side's degree and window length, so
 * points generated from a model of the drop are fitted exactly as the photo's were (the model
 * check of lib/analysis/model-check.ts).
 */
export function fitPolynomial(
  points: FramePoints,
  sameAs?: ProfileFit,
  settings: AnalysisSettings = DEFAULT_SETTINGS,
): ProfileFit {
  const circle = fitWholeCircle(points);
  const start = circleAngles(circle);
  const radius = circle.r;
  const theta = (start.leftDeg / DEG + start.rightDeg / DEG) / 2;
  let lowestV = Infinity;
  for (let i = 0; i < points.v.length; i++) lowestV = Math.min(lowestV, points.v[i]);
  const same = sameAs instanceof PolynomialFit ? sameAs.frames : null;
  const side = (k: -1 | 1, startU: number) => {
    const frame = same?.[k < 0 ? 0 : 1];
    const found = frame
      ? fitWindow(points, k, startU, theta, frame.length, frame.degree)
      : fitSide(points, k, startU, theta, radius, lowestV, settings);
    if (!found) throw new Error('Too few edge points near a contact point for the polynomial fit.');
    return found;
  };
  const left = side(-1, start.leftU);
  const right = side(1, start.rightU);
  return new PolynomialFit(
    [left.frame, right.frame],
    left.coefficients,
    right.coefficients,
    circle.cv + circle.r,
  );
}

export const polynomialFitter: ProfileFitter = {
  method: 'polynomial',
  fit: (points, options) => fitPolynomial(points, options?.sameAs, options?.settings),
};
