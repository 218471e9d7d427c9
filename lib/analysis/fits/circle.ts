/**
 * Circle (spherical cap) fit: the algebraic fit of Kåsa (I. Kåsa, "A circle fitting procedure and
 * its error analysis", IEEE Trans. Instrum. Meas. 25, 1976) as the starting point, refined by
 * geometric least squares (orthogonal distances) with Levenberg–Marquardt.
 */
import { linearLeastSquares } from './least-squares';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import {
  DEG,
  type ContactAngles,
  type DropShape,
  type FramePoints,
  type ProfileFit,
  type ProfileFitter,
} from './types';

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
  // Centred coordinates keep the normal equations well conditioned.
  const design: number[][] = [];
  const rhs = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = u[i] - mu;
    const y = v[i] - mv;
    design.push([x, y, 1]);
    rhs[i] = -(x * x + y * y);
  }
  const [d, e, f] = linearLeastSquares(design, rhs).coefficients;
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
  const index = Float64Array.from({ length: n }, (_, i) => i);
  const zeros = new Float64Array(n);
  const result = levenbergMarquardt(
    { x: index, y: zeros },
    ([cu, cv, r]) =>
      (i) =>
        Math.hypot(u[i] - cu, v[i] - cv) - r,
    {
      initialValues: [start.cu, start.cv, start.r],
      // Started from the algebraic fit, a few Gauss–Newton-like steps converge; the library has no
      // step-size stop, so the count is kept small.
      maxIterations: 6,
      damping: 1e-6,
      errorTolerance: 1e-12,
      jacobianFunction:
        ([cu, cv]) =>
        (i) => {
          const d = Math.hypot(u[i] - cu, v[i] - cv) || 1e-12;
          return [-(u[i] - cu) / d, -(v[i] - cv) / d, -1];
        },
    },
  );
  const [cu, cv, r] = result.parameterValues;
  return { circle: { cu, cv, r }, iterations: result.iterations };
}

export function circleAngles(c: Circle): ContactAngles {
  const ratio = Math.max(-1, Math.min(1, -c.cv / c.r));
  const theta = Math.acos(ratio) * DEG;
  const half = Math.sqrt(Math.max(c.r * c.r - c.cv * c.cv, 0));
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
  angles(p: readonly number[] = this.parameters): ContactAngles {
    return circleAngles({ cu: p[0], cv: p[1], r: p[2] });
  }
  shape(): DropShape {
    return capShape({ cu: this.parameters[0], cv: this.parameters[1], r: this.parameters[2] });
  }
}

export function fitCircle(points: FramePoints): ProfileFit {
  const start = kasaCircle(points.u, points.v);
  const { circle } = refineCircle(points.u, points.v, start);
  return new CircleFit(points, circle);
}

export const circleFitter: ProfileFitter = { method: 'circle', fit: (points) => fitCircle(points) };
