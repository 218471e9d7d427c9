import type { AnalysisSettings } from '../settings';
import type { FitMethod } from '../types';

/**
 * Profile points in the baseline frame: u along the baseline (to the right), v perpendicular to it
 * (up, into the drop). The baseline is v = 0. `side` is −1 for the left branch, +1 for the right.
 */
export interface FramePoints {
  u: Float64Array;
  v: Float64Array;
  side: Int8Array;
  /** Estimate of the drop axis (u). */
  axisU: number;
}

export interface ContactAngles {
  leftDeg: number;
  rightDeg: number;
  /** Where the fitted profile meets the baseline (u; v = 0). */
  leftU: number;
  rightU: number;
}

export interface DropShape {
  heightPx: number;
  apexRadiusPx: number | null;
  bond: number | null;
  volumePx3: number | null;
  surfaceAreaPx2: number | null;
}

/**
 * A fitted profile model: parameters, residuals and the angle at the contact points. Every method
 * has this same shape so methods are interchangeable and can be tested side by side.
 */
export interface ProfileFit {
  readonly method: FitMethod;
  readonly parameterNames: readonly string[];
  readonly parameters: readonly number[];
  /** Finite-difference steps per parameter, for the standard-error estimate. */
  readonly parameterSteps: readonly number[];
  readonly converged: boolean;
  /** Signed distances (px) of the fitted points from the model with these (default: fitted) parameters. */
  residuals(parameters?: readonly number[]): Float64Array;
  /**
   * Contact angles and contact points for these (default: fitted) parameters, where the model
   * meets the baseline, or with `baselineV` the line parallel to it that far above (for the
   * ±1 px baseline sensitivity without a re-fit).
   */
  angles(parameters?: readonly number[], baselineV?: number): ContactAngles;
  shape(): DropShape;
  /**
   * The fitted profile as a polyline in the baseline frame, from the left contact over the apex to
   * the right contact, for drawing; absent for local fits that describe no whole drop.
   */
  curve?(samples?: number): Array<[number, number]> | null;
  /**
   * Fits that measure each side on its own carry the symmetric fit of the whole profile, which is
   * reported instead when the two sides agree within noise (`chooseSides`).
   */
  readonly whole?: ProfileFit;
}

export interface FitOptions {
  /** A fit of the same drop (e.g. with a narrower margin) that may seed iterative fits. */
  previous?: ProfileFit;
  /**
   * Fit these points exactly the way this fit of the photo was made (same window lengths, degree,
   * side choices), for the model check on points generated from the Young–Laplace profile.
   */
  sameAs?: ProfileFit;
  /**
   * The same method's fit of this drop in an earlier frame of a series, its parameters already
   * moved into this baseline frame. Iterative fits start there instead of from their own first
   * guess and stop by exactly the same rules (points, iterations, tolerance) as without it, so the
   * result is the same minimum; fits that need no start (linear and algebraic ones) ignore it.
   */
  warmStart?: WarmStart;
  /** Young–Laplace only: fewer points and iterations (the reference for other methods' checks). */
  quick?: boolean;
  /** Young–Laplace only: the symmetric model alone (no asymmetric fits). */
  symmetricOnly?: boolean;
  settings?: AnalysisSettings;
}

/** A fit of an earlier frame and the shift of its axis and apex into this frame (px, u and v). */
export interface WarmStart {
  readonly fit: ProfileFit;
  readonly shiftU: number;
  readonly shiftV: number;
}

export interface ProfileFitter {
  /** Whether `FitOptions.warmStart` changes where this method's fit starts. */
  readonly warmStarts?: boolean;
  readonly method: FitMethod;
  fit(points: FramePoints, options?: FitOptions): ProfileFit;
}

export const DEG = 180 / Math.PI;

export function rms(values: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < values.length; i++) s += values[i] * values[i];
  return Math.sqrt(s / Math.max(values.length, 1));
}

/** Angle inside the liquid at a contact point, from the profile tangent t (pointing up the profile). */
export function angleFromTangent(tu: number, tv: number, side: -1 | 1): number {
  const [au, av] = tv < 0 ? [-tu, -tv] : [tu, tv];
  return Math.atan2(av, side === -1 ? au : -au) * DEG;
}

/** The points at these indices (in order), as FramePoints. */
export function subsetOf(points: FramePoints, indices: ArrayLike<number>): FramePoints {
  const n = indices.length;
  const u = new Float64Array(n);
  const v = new Float64Array(n);
  const side = new Int8Array(n);
  for (let k = 0; k < n; k++) {
    const i = indices[k];
    u[k] = points.u[i];
    v[k] = points.v[i];
    side[k] = points.side[i];
  }
  return { u, v, side, axisU: points.axisU };
}

