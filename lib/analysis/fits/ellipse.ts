/**
 * Ellipse fit by direct least squares (Fitzgibbon, Pilu & Fisher, "Direct least square fitting of
 * ellipses", IEEE PAMI 21, 1999) in the numerically stable form of Halíř & Flusser (1998): minimise
 * the algebraic distance of A u² + B uv + C v² + D u + E v + F = 0 subject to 4AC − B² = 1, which
 * always yields an ellipse. Coordinates are centred and scaled first. Angles come from the conic's
 * tangent where it crosses the baseline; residuals are Sampson (first-order geometric) distances.
 */
import { EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix';
import { angleFromTangent } from './types';
import type { ContactAngles, DropShape, FramePoints, ProfileFit, ProfileFitter } from './types';

/** Conic coefficients [A, B, C, D, E, F] of the direct least-squares ellipse through (x, y). */
export function directEllipse(x: ArrayLike<number>, y: ArrayLike<number>): number[] {
  const n = x.length;
  const d1 = new Matrix(n, 3);
  const d2 = new Matrix(n, 3);
  for (let i = 0; i < n; i++) {
    d1.set(i, 0, x[i] * x[i]);
    d1.set(i, 1, x[i] * y[i]);
    d1.set(i, 2, y[i] * y[i]);
    d2.set(i, 0, x[i]);
    d2.set(i, 1, y[i]);
    d2.set(i, 2, 1);
  }
  const s1 = d1.transpose().mmul(d1);
  const s2 = d1.transpose().mmul(d2);
  const s3 = d2.transpose().mmul(d2);
  const t = inverse(s3).mmul(s2.transpose()).mul(-1);
  const m = s1.add(s2.mmul(t));
  // Pre-multiply by C1⁻¹ for the constraint matrix C1 = [[0,0,2],[0,−1,0],[2,0,0]].
  const reduced = new Matrix([
    [m.get(2, 0) / 2, m.get(2, 1) / 2, m.get(2, 2) / 2],
    [-m.get(1, 0), -m.get(1, 1), -m.get(1, 2)],
    [m.get(0, 0) / 2, m.get(0, 1) / 2, m.get(0, 2) / 2],
  ]);
  const eig = new EigenvalueDecomposition(reduced);
  const vectors = eig.eigenvectorMatrix;
  let best: number[] | null = null;
  let bestCond = 0;
  for (let k = 0; k < 3; k++) {
    if (Math.abs(eig.imaginaryEigenvalues[k]) > 1e-12) continue;
    const a = vectors.get(0, k);
    const b = vectors.get(1, k);
    const c = vectors.get(2, k);
    const cond = 4 * a * c - b * b;
    if (cond > bestCond) {
      bestCond = cond;
      best = [a, b, c];
    }
  }
  if (!best) throw new Error('No ellipse fits these points.');
  const a2 = t.mmul(Matrix.columnVector(best)).to1DArray();
  return [...best, ...a2];
}

class EllipseFit implements ProfileFit {
  readonly method = 'ellipse' as const;
  readonly parameterNames = ['A', 'B', 'C', 'D', 'E'] as const;
  readonly parameters: readonly number[];
  readonly parameterSteps: readonly number[];
  readonly converged: boolean;
  constructor(
    private readonly x: Float64Array,
    private readonly y: Float64Array,
    private readonly mu: number,
    private readonly mv: number,
    private readonly scale: number,
    conic: number[],
  ) {
    // F is held fixed: a conic is defined only up to scale.
    this.f = conic[5];
    this.parameters = conic.slice(0, 5);
    this.parameterSteps = this.parameters.map((p) => 1e-6 * Math.max(Math.abs(p), 1e-6));
    this.converged = conic.every(Number.isFinite);
  }
  private readonly f: number;
  residuals(p: readonly number[] = this.parameters): Float64Array {
    const [A, B, C, D, E] = p;
    const out = new Float64Array(this.x.length);
    for (let i = 0; i < out.length; i++) {
      const x = this.x[i];
      const y = this.y[i];
      const value = A * x * x + B * x * y + C * y * y + D * x + E * y + this.f;
      const gx = 2 * A * x + B * y + D;
      const gy = B * x + 2 * C * y + E;
      out[i] = (value / Math.hypot(gx, gy)) * this.scale;
    }
    return out;
  }
  angles(p: readonly number[] = this.parameters, baselineV = 0): ContactAngles {
    const [A, B, C, D, E] = p;
    const y0 = (baselineV - this.mv) / this.scale; // the baseline in normalised coordinates
    const qa = A;
    const qb = B * y0 + D;
    const qc = C * y0 * y0 + E * y0 + this.f;
    const disc = qb * qb - 4 * qa * qc;
    if (disc < 0) return { leftDeg: NaN, rightDeg: NaN, leftU: NaN, rightU: NaN };
    const r1 = (-qb - Math.sqrt(disc)) / (2 * qa);
    const r2 = (-qb + Math.sqrt(disc)) / (2 * qa);
    const [xl, xr] = r1 < r2 ? [r1, r2] : [r2, r1];
    const angleAt = (x: number, side: -1 | 1) => {
      const gx = 2 * A * x + B * y0 + D;
      const gy = B * x + 2 * C * y0 + E;
      return angleFromTangent(-gy, gx, side);
    };
    return {
      leftDeg: angleAt(xl, -1),
      rightDeg: angleAt(xr, 1),
      leftU: xl * this.scale + this.mu,
      rightU: xr * this.scale + this.mu,
    };
  }
  shape(): DropShape {
    const [A, B, C, D, E] = this.parameters;
    // Highest point of the ellipse: where ∂F/∂x = 0, i.e. x = −(B y + D) / 2A, on the curve.
    const qa = C - (B * B) / (4 * A);
    const qb = E - (B * D) / (2 * A);
    const qc = this.f - (D * D) / (4 * A);
    const disc = qb * qb - 4 * qa * qc;
    const roots =
      disc >= 0 ? [(-qb - Math.sqrt(disc)) / (2 * qa), (-qb + Math.sqrt(disc)) / (2 * qa)] : [NaN];
    const top = Math.max(...roots);
    return {
      heightPx: top * this.scale + this.mv,
      apexRadiusPx: null,
      bond: null,
      volumePx3: null,
      surfaceAreaPx2: null,
    };
  }
}

export function fitEllipse(points: FramePoints): ProfileFit {
  const n = points.u.length;
  let mu = 0;
  let mv = 0;
  for (let i = 0; i < n; i++) {
    mu += points.u[i];
    mv += points.v[i];
  }
  mu /= n;
  mv /= n;
  let spread = 0;
  for (let i = 0; i < n; i++) spread += (points.u[i] - mu) ** 2 + (points.v[i] - mv) ** 2;
  const scale = Math.sqrt(spread / n) || 1;
  const x = Float64Array.from(points.u, (u) => (u - mu) / scale);
  const y = Float64Array.from(points.v, (v) => (v - mv) / scale);
  return new EllipseFit(x, y, mu, mv, scale, directEllipse(x, y));
}

export const ellipseFitter: ProfileFitter = {
  method: 'ellipse',
  fit: (points) => fitEllipse(points),
};
