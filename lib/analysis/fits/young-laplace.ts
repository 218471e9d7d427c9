/**
 * Axisymmetric Young–Laplace fit (Bashforth & Adams, 1883): the drop profile integrated from the
 * apex (see ../young-laplace.ts) is scaled by the apex radius b, placed with its apex at (u0, v0)
 * on an axis perpendicular to the baseline, and fitted to the edge points by minimising the
 * orthogonal distances with Levenberg–Marquardt. Fitted parameters: axis position u0, apex height
 * v0, apex radius b and Bond number β. The contact angle is the profile's φ where it meets the
 * baseline (depth v0 / b below the apex).
 *
 * Speed: the distance of a point to the profile polyline has analytic derivatives in u0, v0 and b
 * (the offset along the profile normal at the nearest point); only β needs a second profile, one
 * integration per iteration. Each point remembers its nearest profile node between evaluations,
 * so finding it again is a short walk.
 */
import {
  findDepthIndex,
  integrateYoungLaplace,
  profileAtDepth,
  type YoungLaplaceProfile,
} from '../young-laplace';
import { fitWholeCircle } from './circle';
import { levenbergMarquardt, sumOfSquares } from './least-squares';
import {
  DEG,
  type ContactAngles,
  type DropShape,
  type FramePoints,
  type ProfileFit,
  type ProfileFitter,
} from './types';
import { DEFAULT_SETTINGS, type AnalysisSettings } from '../settings';

/** Arc-length step of the fitted profiles (units of b): the chord error is h²/8 ≈ 3·10⁻⁶ b. */
const FIT_STEP = 0.005;

/** Profiles by Bond number, so parameter steps that keep β reuse the integration. */
class ProfileCache {
  private readonly entries = new Map<number, YoungLaplaceProfile>();
  get(bond: number, depth: number): YoungLaplaceProfile {
    const hit = this.entries.get(bond);
    if (hit && (hit.z[hit.n - 1] >= depth || hit.phi[hit.n - 1] >= Math.PI)) return hit;
    const profile = integrateYoungLaplace(bond, {
      maxZ: depth * 1.05 + 0.05,
      step: FIT_STEP / Math.max(1, Math.sqrt(bond)),
    });
    if (this.entries.size > 8) this.entries.clear();
    this.entries.set(bond, profile);
    return profile;
  }
}

/**
 * Signed distances (px) of the points from the profile placed at p = [u0, v0, b, β], positive
 * outside the drop; with `jacobian` (n × 3 or n × 4), also the derivatives in u0, v0 and b.
 * `nearest` keeps each point's nearest node between calls.
 */
function distances(
  points: FramePoints,
  profile: YoungLaplaceProfile,
  p: ArrayLike<number>,
  nearest: Int32Array,
  out: Float64Array,
  jacobian: Float64Array | null,
  stride: number,
): void {
  const u0 = p[0];
  const v0 = p[1];
  const b = p[2];
  const { x, z, n } = profile;
  const { u, v } = points;
  for (let i = 0; i < u.length; i++) {
    const du = u[i] - u0;
    const sign = du < 0 ? -1 : 1;
    const X = (sign * du) / b;
    const Z = (v0 - v[i]) / b;
    let k = nearest[i];
    if (k < 0 || k >= n) k = Math.min(Math.max(findDepthIndex(profile, Z), 0), n - 1);
    let best = (x[k] - X) ** 2 + (z[k] - Z) ** 2;
    for (;;) {
      if (k + 1 < n) {
        const d = (x[k + 1] - X) ** 2 + (z[k + 1] - Z) ** 2;
        if (d < best) {
          best = d;
          k++;
          continue;
        }
      }
      if (k > 0) {
        const d = (x[k - 1] - X) ** 2 + (z[k - 1] - Z) ** 2;
        if (d < best) {
          best = d;
          k--;
          continue;
        }
      }
      break;
    }
    nearest[i] = k;
    // Project onto the segments on either side of node k; keep the closer foot point.
    let bestDist = Infinity;
    let signed = 0;
    let nx = 0;
    let nz = -1;
    let qx = x[k];
    let qz = z[k];
    for (let side = -1; side <= 0; side++) {
      const a = k + side;
      const c = a + 1;
      if (a < 0 || c >= n) continue;
      const sx = x[c] - x[a];
      const sz = z[c] - z[a];
      const len2 = sx * sx + sz * sz;
      if (len2 <= 0) continue;
      let t = ((X - x[a]) * sx + (Z - z[a]) * sz) / len2;
      t = t < 0 ? 0 : t > 1 ? 1 : t;
      const px = x[a] + t * sx;
      const pz = z[a] + t * sz;
      const dist = Math.hypot(X - px, Z - pz);
      if (dist < bestDist) {
        bestDist = dist;
        const len = Math.sqrt(len2);
        // Outward normal of the profile running from the apex: (sin φ, −cos φ) = (t_z, −t_x).
        nx = sz / len;
        nz = -sx / len;
        signed = nx * (X - px) + nz * (Z - pz);
        qx = px;
        qz = pz;
      }
    }
    out[i] = signed * b;
    if (jacobian) {
      const row = i * stride;
      jacobian[row] = -sign * nx;
      jacobian[row + 1] = nz;
      jacobian[row + 2] = -(nx * qx + nz * qz);
    }
  }
}

/** Residuals and analytic/forward-difference Jacobian of the four-parameter profile. */
class YoungLaplaceModel {
  readonly cache = new ProfileCache();
  private readonly nearest: Int32Array;
  private readonly nearestShifted: Int32Array;
  private readonly shifted: Float64Array;
  constructor(
    readonly points: FramePoints,
    readonly maxBond: number,
  ) {
    this.nearest = new Int32Array(points.u.length).fill(-1);
    this.nearestShifted = new Int32Array(points.u.length).fill(-1);
    this.shifted = new Float64Array(points.u.length);
  }
  private depthOf(p: ArrayLike<number>): number {
    let deepest = 0;
    const { v } = this.points;
    for (let i = 0; i < v.length; i++) deepest = Math.max(deepest, (p[1] - v[i]) / p[2]);
    return Math.max(deepest, p[1] / p[2]);
  }
  residuals(p: ArrayLike<number>, out: Float64Array, jacobian: Float64Array | null = null): void {
    const bond = Math.max(p[3], 0);
    const depth = this.depthOf(p);
    distances(this.points, this.cache.get(bond, depth), p, this.nearest, out, jacobian, 4);
    if (!jacobian) return;
    // ∂/∂β by a forward difference (backward at the upper bound).
    const h = 1e-4 * Math.max(1, bond);
    const towards = bond + h > this.maxBond ? -h : h;
    const moved = [p[0], p[1], p[2], bond + towards];
    distances(
      this.points,
      this.cache.get(bond + towards, depth),
      moved,
      this.nearestShifted,
      this.shifted,
      null,
      4,
    );
    for (let i = 0; i < out.length; i++) jacobian[i * 4 + 3] = (this.shifted[i] - out[i]) / towards;
  }
}

class YoungLaplaceFit implements ProfileFit {
  readonly method = 'young-laplace' as const;
  readonly parameterNames = ['axisU', 'apexV', 'apexRadius', 'bond'] as const;
  readonly parameters: readonly number[];
  readonly parameterSteps: readonly number[];
  constructor(
    private readonly model: YoungLaplaceModel,
    parameters: ArrayLike<number>,
    readonly converged: boolean,
  ) {
    this.parameters = Array.from(parameters);
    const b = this.parameters[2];
    this.parameterSteps = [1e-3 * b, 1e-3 * b, 1e-3 * b, 1e-3];
  }
  residuals(p: readonly number[] = this.parameters): Float64Array {
    const out = new Float64Array(this.model.points.u.length);
    this.model.residuals(p, out);
    return out;
  }
  angles(p: readonly number[] = this.parameters, baselineV = 0): ContactAngles {
    const [u0, v0, b, bond] = p;
    const depth = (v0 - baselineV) / b;
    const profile = this.model.cache.get(Math.max(bond, 0), depth);
    const at = profileAtDepth(profile, depth);
    // A profile that closes (φ = π) above the baseline touches it at 180°.
    const theta = at.reached ? at.phi * DEG : 180;
    return { leftDeg: theta, rightDeg: theta, leftU: u0 - at.x * b, rightU: u0 + at.x * b };
  }
  shape(): DropShape {
    const [, v0, b, bond] = this.parameters;
    const at = profileAtDepth(this.model.cache.get(Math.max(bond, 0), v0 / b), v0 / b);
    return {
      heightPx: v0,
      apexRadiusPx: b,
      bond,
      volumePx3: at.volume * b ** 3,
      surfaceAreaPx2: at.area * b ** 2,
    };
  }
}

/** Evenly thinned subset (at most `limit` points) to keep each iteration cheap. */
function thin(points: FramePoints, limit: number): FramePoints {
  const n = points.u.length;
  if (n <= limit) return points;
  const step = n / limit;
  const idx = Array.from({ length: limit }, (_, k) => Math.floor(k * step));
  return {
    u: Float64Array.from(idx, (i) => points.u[i]),
    v: Float64Array.from(idx, (i) => points.v[i]),
    side: Int8Array.from(idx, (i) => points.side[i]),
    axisU: points.axisU,
  };
}

function solve(
  model: YoungLaplaceModel,
  start: ArrayLike<number>,
  iterations: number,
): { p: Float64Array; cost: number } {
  const n = model.points.u.length;
  const b0 = start[2];
  const result = levenbergMarquardt(n, start, (p, r, jac) => model.residuals(p, r, jac), {
    maxIterations: iterations,
    initialDamping: 1e-2,
    stepTolerance: 1e-6,
    parameterScale: [b0, b0, b0, 1],
    lower: [-Infinity, 1, 1, 0],
    upper: [Infinity, Infinity, Infinity, model.maxBond],
  });
  return { p: result.parameters, cost: result.cost / Math.max(n, 1) };
}

export function fitYoungLaplace(
  points: FramePoints,
  previous?: ProfileFit,
  settings: AnalysisSettings = DEFAULT_SETTINGS,
): ProfileFit {
  const maxBond = settings.youngLaplaceMaxBond;
  let start: number[];
  const seededFromPrevious = previous?.method === 'young-laplace';
  if (seededFromPrevious) {
    start = [...previous.parameters];
  } else {
    const c = fitWholeCircle(points);
    start = [c.cu, c.cv + c.r, c.r, 0];
  }
  let best: { p: ArrayLike<number>; cost: number } = { p: start, cost: Infinity };
  if (!seededFromPrevious) {
    const coarse = new YoungLaplaceModel(thin(points, 240), maxBond);
    // Two Bond-number starts: the circle seeds the shape, gravity flattens it.
    for (const bond of [0.1, 1]) {
      const seeded = [start[0], start[1], start[2] / (1 + 0.4 * bond), bond];
      const trial = solve(coarse, seeded, 12);
      if (trial.cost < best.cost) best = trial;
    }
  }
  const fine = new YoungLaplaceModel(thin(points, 500), maxBond);
  const final = solve(fine, best.p, seededFromPrevious ? 6 : 12);
  const residuals = new Float64Array(fine.points.u.length);
  fine.residuals(final.p, residuals);
  const converged = Number.isFinite(sumOfSquares(residuals)) && final.p.every(Number.isFinite);
  // Residuals (and so the standard error) on the evenly thinned set: neighbouring edge points are
  // correlated, so every third or fourth point carries nearly all the information, at a fraction of the cost.
  return new YoungLaplaceFit(fine, final.p, converged);
}

export const youngLaplaceFitter: ProfileFitter = { method: 'young-laplace', fit: fitYoungLaplace };
