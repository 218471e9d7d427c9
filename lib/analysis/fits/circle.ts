/**
 * Circle (spherical cap) fit: the algebraic fit of Kåsa (I. Kåsa, "A circle fitting procedure and
 * its error analysis", IEEE Trans. Instrum. Meas. 25, 1976) as the starting point, refined by
 * geometric least squares (orthogonal distances) with Levenberg–Marquardt.
 *
 * The angle is read from a cap fitted to the part of the profile next to the contact line (common
 * practice for drops that gravity flattens: the cap is only asked to match the profile where the
 * angle is read). First the whole profile is fitted; then, twice, only the points within
 * d₀ + 0.2 R of each contact point are refitted (d₀ the distance from the contact point to the
 * nearest visible edge point on that side, R the previous radius). On an exact spherical cap every
 * window gives the same circle. Height, volume and area come from the whole-profile cap.
 */
import { levenbergMarquardt, linearLeastSquares } from './least-squares';
import { DEG, subsetOf } from './types';
import type { ContactAngles, DropShape, FramePoints, ProfileFit, ProfileFitter } from './types';
import { TwoSidedFit } from './two-sided';
import { DEFAULT_SETTINGS, type AnalysisSettings } from '../settings';

export interface Circle {
  cu: number;
  cv: number;
  r: number;
}

/** Kåsa: minimise Σ (u² + v² + D u + E v + F)², a linear least-squares problem. */
export function kasaCircle(u: ArrayLike<number>, v: ArrayLike<number>): Circle {
  const n = u.length;
  let mu = 0;
  let mv = 0;
  for (let i = 0; i < n; i++) {
    mu += u[i];
    mv += v[i];
  }
  mu /= n;
  mv /= n;
  // Centred coordinates keep the problem well conditioned.
  const design = new Float64Array(3 * n);
  const rhs = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = u[i] - mu;
    const y = v[i] - mv;
    design[3 * i] = x;
    design[3 * i + 1] = y;
    design[3 * i + 2] = 1;
    rhs[i] = -(x * x + y * y);
  }
  const [d, e, f] = linearLeastSquares(design, rhs, 3).coefficients;
  const cu = -d / 2;
  const cv = -e / 2;
  return { cu: cu + mu, cv: cv + mv, r: Math.sqrt(Math.max(cu * cu + cv * cv - f, 0)) };
}

/** Geometric refinement: minimise Σ (|p − c| − r)² by Levenberg–Marquardt with the analytic Jacobian. */
export function refineCircle(
  u: ArrayLike<number>,
  v: ArrayLike<number>,
  start: Circle,
): { circle: Circle; iterations: number } {
  const n = u.length;
  const result = levenbergMarquardt(
    n,
    [start.cu, start.cv, start.r],
    (p, r, jac) => {
      const cu = p[0];
      const cv = p[1];
      const radius = p[2];
      for (let i = 0; i < n; i++) {
        const du = u[i] - cu;
        const dv = v[i] - cv;
        const d = Math.sqrt(du * du + dv * dv) || 1e-12;
        r[i] = d - radius;
        jac[3 * i] = -du / d;
        jac[3 * i + 1] = -dv / d;
        jac[3 * i + 2] = -1;
      }
    },
    { maxIterations: 50, stepTolerance: 1e-7 * Math.max(start.r, 1) },
  );
  const [cu, cv, r] = result.parameters;
  return { circle: { cu, cv, r }, iterations: result.iterations };
}

/** Angles where the circle meets the baseline (or the parallel line `baselineV` above it). */
export function circleAngles(c: Circle, baselineV = 0): ContactAngles {
  const cv = c.cv - baselineV;
  const ratio = Math.max(-1, Math.min(1, -cv / c.r));
  const theta = Math.acos(ratio) * DEG;
  const half = Math.sqrt(Math.max(c.r * c.r - cv * cv, 0));
  return { leftDeg: theta, rightDeg: theta, leftU: c.cu - half, rightU: c.cu + half };
}

/** Spherical cap cut by the baseline v = 0: height, volume πh²(3R − h)/3, area 2πRh. */
export function capShape(c: Circle): DropShape {
  const h = c.cv + c.r;
  return {
    heightPx: h,
    apexRadiusPx: c.r,
    bond: null,
    volumePx3: (Math.PI * h * h * (3 * c.r - h)) / 3,
    surfaceAreaPx2: 2 * Math.PI * c.r * h,
  };
}

class CircleFit implements ProfileFit {
  readonly method = 'circle' as const;
  readonly parameterNames = ['centreU', 'centreV', 'radius'] as const;
  readonly parameters: readonly number[];
  readonly parameterSteps: readonly number[];
  readonly converged: boolean;
  constructor(
    private readonly points: FramePoints,
    circle: Circle,
    /** The cap through the whole profile, for height, volume and area. */
    readonly wholeCircle: Circle = circle,
  ) {
    this.parameters = [circle.cu, circle.cv, circle.r];
    this.parameterSteps = [1e-4 * circle.r, 1e-4 * circle.r, 1e-4 * circle.r];
    this.converged = Number.isFinite(circle.r) && circle.r > 0;
  }
  residuals(p: readonly number[] = this.parameters): Float64Array {
    const { u, v } = this.points;
    const out = new Float64Array(u.length);
    for (let i = 0; i < u.length; i++) out[i] = Math.hypot(u[i] - p[0], v[i] - p[1]) - p[2];
    return out;
  }
  angles(p: readonly number[] = this.parameters, baselineV = 0): ContactAngles {
    return circleAngles({ cu: p[0], cv: p[1], r: p[2] }, baselineV);
  }
  shape(): DropShape {
    return capShape(this.wholeCircle);
  }
  curve(samples = 160): Array<[number, number]> | null {
    const [cu, cv, r] = this.parameters;
    if (!(r > 0)) return null;
    // Angles (from the centre) where the circle is above the baseline v = 0.
    const limit = Math.abs(cv) >= r ? Math.PI : Math.acos(Math.max(-1, Math.min(1, -cv / r)));
    const curve: Array<[number, number]> = [];
    for (let i = 0; i <= samples; i++) {
      const a = Math.PI / 2 + limit - (2 * limit * i) / samples;
      curve.push([cu + r * Math.cos(a), Math.max(0, cv + r * Math.sin(a))]);
    }
    return curve;
  }
}

/** Cap through the whole profile (Kåsa start, geometric refinement). */
export function fitWholeCircle(points: FramePoints): Circle {
  const start = kasaCircle(points.u, points.v);
  return refineCircle(points.u, points.v, start).circle;
}

/** Fewest points per side in a contact-line window; with fewer the whole profile is used. */
const MIN_WINDOW_POINTS = 12;

/**
 * The points within d₀ + w · R of each contact point of `circle` (w = `circleContactWindow`), or
 * null if too few.
 */
function contactWindow(points: FramePoints, circle: Circle, window: number): FramePoints | null {
  const { leftU, rightU } = circleAngles(circle);
  if (!Number.isFinite(leftU) || !Number.isFinite(rightU)) return null;
  const n = points.u.length;
  const distance = new Float64Array(n);
  const nearest = [Infinity, Infinity];
  for (let i = 0; i < n; i++) {
    const k = points.side[i] < 0 ? 0 : 1;
    distance[i] = Math.hypot(points.u[i] - (k === 0 ? leftU : rightU), points.v[i]);
    nearest[k] = Math.min(nearest[k], distance[i]);
  }
  const keep: number[] = [];
  const counts = [0, 0];
  for (let i = 0; i < n; i++) {
    const k = points.side[i] < 0 ? 0 : 1;
    if (distance[i] <= nearest[k] + window * circle.r) {
      keep.push(i);
      counts[k]++;
    }
  }
  if (counts[0] < MIN_WINDOW_POINTS || counts[1] < MIN_WINDOW_POINTS) return null;
  return {
    u: Float64Array.from(keep, (i) => points.u[i]),
    v: Float64Array.from(keep, (i) => points.v[i]),
    side: Int8Array.from(keep, (i) => points.side[i]),
    axisU: points.axisU,
  };
}

/** The whole-profile cap as a ProfileFit (e.g. for the apex cap of the height–width method). */
export function fitCircleToAll(points: FramePoints): ProfileFit {
  return new CircleFit(points, fitWholeCircle(points));
}

/** The contact-line cap of both sides together (one circle). */
export function fitJointCircle(
  points: FramePoints,
  settings: AnalysisSettings = DEFAULT_SETTINGS,
): ProfileFit {
  const whole = fitWholeCircle(points);
  let circle = whole;
  let fitted = points;
  for (let pass = 0; pass < 2; pass++) {
    const window = contactWindow(points, circle, settings.circleContactWindow);
    if (!window) break;
    // Started from the previous cap, which is already close: no algebraic start needed.
    const next = refineCircle(window.u, window.v, circle).circle;
    if (!Number.isFinite(next.r) || next.r <= 0) break;
    circle = next;
    fitted = window;
  }
  return new CircleFit(fitted, circle, whole);
}

/**
 * Each side's own contact-line cap: the joint cap's window on that side, refitted alone (started
 * from the joint cap).
 */
export function fitCircle(
  points: FramePoints,
  settings: AnalysisSettings = DEFAULT_SETTINGS,
): ProfileFit {
  const joint = fitJointCircle(points, settings);
  const [cu, cv, r] = joint.parameters;
  const circle = { cu, cv, r };
  const whole = (joint as CircleFit).wholeCircle;
  const window = contactWindow(points, circle, settings.circleContactWindow) ?? points;
  const sideFit = (side: -1 | 1): ProfileFit => {
    const keep: number[] = [];
    for (let i = 0; i < window.u.length; i++) if (window.side[i] === side) keep.push(i);
    const own = subsetOf(window, keep);
    const fitted = refineCircle(own.u, own.v, circle).circle;
    return new CircleFit(own, Number.isFinite(fitted.r) && fitted.r > 0 ? fitted : circle, whole);
  };
  return new TwoSidedFit(sideFit(-1), sideFit(1), joint, cu);
}

export const circleFitter: ProfileFitter = {
  method: 'circle',
  fit: (points, options) => fitCircle(points, options?.settings),
};
