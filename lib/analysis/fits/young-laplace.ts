/**
 * Axisymmetric Young–Laplace fit (Bashforth & Adams, 1883): the drop profile integrated from the
 * apex (see ../young-laplace.ts) is scaled by the apex radius b, placed with its apex at (u0, v0)
 * on an axis perpendicular to the baseline, and fitted to the edge points by minimising the
 * orthogonal distances with Levenberg–Marquardt (ml-levenberg-marquardt). Fitted parameters: axis
 * position u0, apex height v0, apex radius b and Bond number β. The contact angle is the profile's
 * φ where it meets the baseline (depth v0 / b below the apex).
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import {
  integrateYoungLaplace,
  profileAtDepth,
  findDepthIndex,
  type YoungLaplaceProfile,
} from '../young-laplace';
import { fitWholeCircle } from './circle';
import {
  DEG,
  type ContactAngles,
  type DropShape,
  type FramePoints,
  type ProfileFit,
  type ProfileFitter,
} from './types';

const MAX_BOND = 20;

/** Profiles by Bond number, so parameter steps that keep β reuse the integration. */
class ProfileCache {
  private readonly entries = new Map<number, YoungLaplaceProfile>();
  constructor(private readonly maxDepth: () => number) {}
  get(bond: number, depth: number): YoungLaplaceProfile {
    const hit = this.entries.get(bond);
    if (hit && hit.z[hit.n - 1] >= depth) return hit;
    const profile = integrateYoungLaplace(bond, {
      maxZ: Math.max(depth, this.maxDepth()) * 1.05 + 0.05,
    });
    if (this.entries.size > 16) this.entries.clear();
    this.entries.set(bond, profile);
    return profile;
  }
}

/**
 * Signed distance (units of b) from (X, Z) (X ≥ 0 lateral, Z depth below apex) to the profile
 * polyline; positive outside the drop. Starts at the node of equal depth and walks downhill.
 */
function distanceToProfile(profile: YoungLaplaceProfile, X: number, Z: number): number {
  const { x, z, n } = profile;
  let k = Math.min(Math.max(findDepthIndex(profile, Z), 0), n - 2);
  const d2 = (i: number) => (x[i] - X) ** 2 + (z[i] - Z) ** 2;
  let best = d2(k);
  for (;;) {
    if (k + 1 < n && d2(k + 1) < best) {
      k++;
      best = d2(k);
    } else if (k > 0 && d2(k - 1) < best) {
      k--;
      best = d2(k);
    } else break;
  }
  // Project onto the two segments around node k.
  let bestDist = Math.sqrt(best);
  let sign = 0;
  for (const [a, b] of [
    [k - 1, k],
    [k, k + 1],
  ]) {
    if (a < 0 || b >= n) continue;
    const sx = x[b] - x[a];
    const sz = z[b] - z[a];
    const len2 = sx * sx + sz * sz;
    if (len2 <= 0) continue;
    const t = Math.min(1, Math.max(0, ((X - x[a]) * sx + (Z - z[a]) * sz) / len2));
    const px = x[a] + t * sx;
    const pz = z[a] + t * sz;
    const dist = Math.hypot(X - px, Z - pz);
    // Cross product of the tangent (sx, sz) and the offset: positive on the outer side.
    const cross = sx * (Z - pz) - sz * (X - px);
    if (dist <= bestDist + 1e-15 || sign === 0) {
      bestDist = Math.min(bestDist, dist);
      sign = cross < 0 ? 1 : -1;
    }
  }
  return sign * bestDist;
}

class YoungLaplaceFit implements ProfileFit {
  readonly method = 'young-laplace' as const;
  readonly parameterNames = ['axisU', 'apexV', 'apexRadius', 'bond'] as const;
  readonly parameters: readonly number[];
  readonly parameterSteps: readonly number[];
  constructor(
    private readonly points: FramePoints,
    private readonly cache: ProfileCache,
    parameters: number[],
    readonly converged: boolean,
  ) {
    this.parameters = parameters;
    const b = parameters[2];
    this.parameterSteps = [1e-3 * b, 1e-3 * b, 1e-3 * b, 1e-3];
  }
  residuals(p: readonly number[] = this.parameters): Float64Array {
    return youngLaplaceResiduals(this.points, this.cache, p);
  }
  angles(p: readonly number[] = this.parameters): ContactAngles {
    const [u0, v0, b, bond] = p;
    const profile = this.cache.get(bond, v0 / b);
    const at = profileAtDepth(profile, v0 / b);
    // A profile that closes (φ = π) above the baseline touches it at 180°.
    const theta = at.reached ? at.phi * DEG : 180;
    return { leftDeg: theta, rightDeg: theta, leftU: u0 - at.x * b, rightU: u0 + at.x * b };
  }
  shape(): DropShape {
    const [, v0, b, bond] = this.parameters;
    const at = profileAtDepth(this.cache.get(bond, v0 / b), v0 / b);
    return {
      heightPx: v0,
      apexRadiusPx: b,
      bond,
      volumePx3: at.volume * b ** 3,
      surfaceAreaPx2: at.area * b ** 2,
    };
  }
}

function youngLaplaceResiduals(
  points: FramePoints,
  cache: ProfileCache,
  p: readonly number[],
): Float64Array {
  const [u0, v0, b, bond] = p;
  const { u, v } = points;
  let deepest = 0;
  for (let i = 0; i < v.length; i++) deepest = Math.max(deepest, (v0 - v[i]) / b);
  const profile = cache.get(Math.max(bond, 0), deepest);
  const out = new Float64Array(u.length);
  for (let i = 0; i < u.length; i++)
    out[i] = distanceToProfile(profile, Math.abs(u[i] - u0) / b, (v0 - v[i]) / b) * b;
  return out;
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
  points: FramePoints,
  cache: ProfileCache,
  start: number[],
  iterations: number,
): { p: number[]; error: number } {
  const n = points.u.length;
  const index = Float64Array.from({ length: n }, (_, i) => i);
  let residuals: Float64Array | null = null;
  let key: number[] | null = null;
  const b0 = start[2];
  const result = levenbergMarquardt(
    { x: index, y: new Float64Array(n) },
    (p) => {
      // The library evaluates point by point; compute all residuals once per parameter vector.
      if (!key || key.some((value, i) => value !== p[i])) {
        key = p.slice();
        residuals = youngLaplaceResiduals(points, cache, p);
      }
      const r = residuals as Float64Array;
      return (i) => r[i];
    },
    {
      initialValues: start,
      maxIterations: iterations,
      damping: 1e-2,
      errorTolerance: 1e-10,
      gradientDifference: [1e-3 * b0, 1e-3 * b0, 1e-3 * b0, 1e-4],
      centralDifference: true,
      minValues: [-Infinity, 1, 1, 0],
      maxValues: [Infinity, Infinity, Infinity, MAX_BOND],
    },
  );
  return { p: result.parameterValues, error: result.parameterError };
}

export function fitYoungLaplace(points: FramePoints, previous?: ProfileFit): ProfileFit {
  let maxV = 0;
  for (let i = 0; i < points.v.length; i++) maxV = Math.max(maxV, points.v[i]);
  let start: number[];
  if (previous && previous.method === 'young-laplace') {
    start = [...previous.parameters];
  } else {
    const c = fitWholeCircle(points);
    start = [c.cu, c.cv + c.r, c.r, 0];
  }
  let depthHint = start[1] / start[2];
  const cache = new ProfileCache(() => depthHint);
  const coarse = thin(points, 240);
  let best = { p: start, error: Infinity };
  const seededFromPrevious = previous?.method === 'young-laplace';
  if (!seededFromPrevious) {
    // Two Bond-number starts: the circle seeds the shape, gravity flattens it.
    for (const bond of [0.1, 1]) {
      const seeded = [start[0], start[1], start[2] / (1 + 0.4 * bond), bond];
      const trial = solve(coarse, cache, seeded, 10);
      if (trial.error < best.error) best = trial;
    }
  }
  depthHint = best.p[1] / best.p[2];
  const fine = thin(points, 500);
  const final = solve(fine, cache, best.p, seededFromPrevious ? 4 : 10);
  const converged = Number.isFinite(final.error) && final.p.every(Number.isFinite);
  // Residuals (and so the standard error) on the evenly thinned set: neighbouring edge points are
  // correlated, so every third or fourth point carries nearly all the information, at a fraction of the cost.
  return new YoungLaplaceFit(fine, cache, final.p, converged);
}

export const youngLaplaceFitter: ProfileFitter = { method: 'young-laplace', fit: fitYoungLaplace };
