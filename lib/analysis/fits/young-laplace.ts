/**
 * Young–Laplace fit (Bashforth & Adams, 1883): the drop profile integrated from the apex (see
 * ../young-laplace-profile.ts) is scaled by the apex radius b, placed with its apex at (u0, v0) on
 * an axis perpendicular to the baseline, and fitted to the edge points by minimising the orthogonal
 * distances with Levenberg–Marquardt. The contact angle is the profile's φ where it meets the
 * baseline (depth v0 / b below the apex).
 *
 * Two models, the second containing the first:
 * - symmetric: [u0, v0, b, β], the axisymmetric drop;
 * - asymmetric: [u0, v0, b, β, τ], each half integrated from the common apex with the hydrostatic
 *   term along an inclined stage, +τ x on the right and −τ x on the left (τ = 0 is the symmetric
 *   drop). A drop leaning one way — a tilted stage, a contact line pinned on one side — gets its
 *   own left and right angle. `chooseSides` (two-sided.ts) reports it only when the two angles
 *   differ by more than noise explains; otherwise the symmetric fit, which is more precise.
 *
 * Speed: the distance of a point to the profile polyline has analytic derivatives in u0, v0 and b
 * (the offset along the profile normal at the nearest point); β and τ need a second profile per
 * half and iteration. Each point remembers its nearest profile node between evaluations, so
 * finding it again is a short walk.
 */
import {
  findDepthIndex,
  integrateYoungLaplace,
  profileAtDepth,
  type YoungLaplaceProfile,
} from '../young-laplace-profile';
import { fitWholeCircle } from './circle';
import { levenbergMarquardt, sumOfSquares } from './least-squares';
import {
  DEG,
  type ContactAngles,
  type DropShape,
  type FitOptions,
  type FramePoints,
  type ProfileFit,
  type ProfileFitter,
  subsetOf,
} from './types';
import { DEFAULT_SETTINGS } from '../settings';

/** Arc-length step of the fitted profiles (units of b): the chord error is h²/8 ≈ 3·10⁻⁶ b. */
const FIT_STEP = 0.005;
/** The quick fit's step: chord error 5·10⁻⁵ b, 0.01 px for a 200 px apex radius. */
const QUICK_STEP = 0.02;

/** Profiles by Bond number and stage term, so parameter steps that keep them reuse the integration. */
class ProfileCache {
  private readonly entries = new Map<string, YoungLaplaceProfile>();
  constructor(private readonly step: number) {}
  get(bond: number, tilt: number, depth: number): YoungLaplaceProfile {
    const key = `${bond}|${tilt}`;
    const hit = this.entries.get(key);
    if (hit && (hit.z[hit.n - 1] >= depth || hit.phi[hit.n - 1] >= Math.PI)) return hit;
    const profile = integrateYoungLaplace(bond, {
      maxZ: depth * 1.05 + 0.05,
      step: this.step / Math.max(1, Math.sqrt(bond), Math.sqrt(Math.abs(tilt))),
      tilt,
    });
    if (this.entries.size > 12) this.entries.clear();
    this.entries.set(key, profile);
    return profile;
  }
}

/**
 * Signed distance (px) of point i from the half-profile placed at (u0, v0, b), positive outside
 * the drop; with `jacobian`, also its derivatives in u0, v0 and b (columns 0–2 of row i).
 * `nearest` keeps each point's nearest node between calls.
 */
function distanceTo(
  profile: YoungLaplaceProfile,
  du: number,
  height: number,
  v0: number,
  b: number,
  nearest: Int32Array,
  i: number,
  jacobian: Float64Array | null,
  row: number,
): number {
  const { x, z, n } = profile;
  const sign = du < 0 ? -1 : 1;
  const X = (sign * du) / b;
  const Z = (v0 - height) / b;
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
  for (let a = k - 1; a <= k; a++) {
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
  if (jacobian) {
    jacobian[row] = -sign * nx;
    jacobian[row + 1] = nz;
    jacobian[row + 2] = -(nx * qx + nz * qz);
  }
  return signed * b;
}

/**
 * The three profile models, by their parameters:
 * - 'symmetric': [u0, v0, b, β];
 * - 'stage': [u0, v0, b, β, τ], the halves with ±τ x along an inclined stage;
 * - 'sides': [u0, v0, b_left, β_left, b_right, β_right], each half its own axisymmetric profile
 *   from the common apex (a contact line pinned on one side).
 */
export type YoungLaplaceKind = 'symmetric' | 'stage' | 'sides';

const SIZE: Record<YoungLaplaceKind, number> = { symmetric: 4, stage: 5, sides: 6 };

/** One half as [u0, v0, b, β, τ] (τ signed for that half). */
function halfParameters(kind: YoungLaplaceKind, p: ArrayLike<number>, side: -1 | 1): number[] {
  if (kind === 'sides') {
    return side < 0 ? [p[0], p[1], p[2], p[3], 0] : [p[0], p[1], p[4], p[5], 0];
  }
  return [p[0], p[1], p[2], p[3], kind === 'stage' ? side * p[4] : 0];
}

/** Residuals and Jacobian of one of the profile models. */
class YoungLaplaceModel {
  readonly cache: ProfileCache;
  readonly size: number;
  private readonly nearest: Int32Array;
  private readonly nearestMoved: Int32Array;
  private readonly moved: Float64Array;
  constructor(
    readonly points: FramePoints,
    readonly maxBond: number,
    readonly kind: YoungLaplaceKind,
    step = FIT_STEP,
  ) {
    const n = points.u.length;
    this.cache = new ProfileCache(step);
    this.size = SIZE[kind];
    this.nearest = new Int32Array(n).fill(-1);
    this.nearestMoved = new Int32Array(n).fill(-1);
    this.moved = new Float64Array(n);
  }
  /** The half-profile of one side for these parameters, reaching `depth` (units of its own b). */
  profile(p: ArrayLike<number>, side: -1 | 1, depth: number): YoungLaplaceProfile {
    const [, , , bond, tilt] = halfParameters(this.kind, p, side);
    return this.cache.get(Math.max(bond, 0), tilt, depth);
  }
  private pass(
    p: ArrayLike<number>,
    out: Float64Array,
    nearest: Int32Array,
    jacobian: Float64Array | null,
  ): void {
    const { u, v } = this.points;
    const u0 = p[0];
    const v0 = p[1];
    const left = halfParameters(this.kind, p, -1);
    const right = halfParameters(this.kind, p, 1);
    let deepL = v0 / left[2];
    let deepR = v0 / right[2];
    for (let i = 0; i < u.length; i++) {
      if (u[i] < u0) deepL = Math.max(deepL, (v0 - v[i]) / left[2]);
      else deepR = Math.max(deepR, (v0 - v[i]) / right[2]);
    }
    const profileL = this.cache.get(Math.max(left[3], 0), left[4], deepL);
    const profileR = this.cache.get(Math.max(right[3], 0), right[4], deepR);
    const k = this.size;
    const sides = this.kind === 'sides';
    for (let i = 0; i < u.length; i++) {
      const du = u[i] - u0;
      const isLeft = du < 0;
      const half = isLeft ? left : right;
      const row = i * k;
      out[i] = distanceTo(
        isLeft ? profileL : profileR,
        du,
        v[i],
        v0,
        half[2],
        nearest,
        i,
        jacobian,
        row,
      );
      if (jacobian && sides) {
        // Columns: u0, v0, b_left, β_left, b_right, β_right; distanceTo wrote ∂/∂b in column 2.
        const db = jacobian[row + 2];
        jacobian[row + 2] = isLeft ? db : 0;
        jacobian[row + 4] = isLeft ? 0 : db;
      }
    }
  }
  residuals(p: ArrayLike<number>, out: Float64Array, jacobian: Float64Array | null = null): void {
    this.pass(p, out, this.nearest, jacobian);
    if (!jacobian) return;
    // Bond numbers and the stage term by forward differences (backward at the upper bound).
    const moved = Array.from(p);
    const numeric = this.kind === 'sides' ? [3, 5] : this.kind === 'stage' ? [3, 4] : [3];
    for (const j of numeric) {
      const isBond = j === 3 || j === 5;
      const h = 1e-4 * Math.max(1, Math.abs(p[j]));
      const towards = isBond && p[j] + h > this.maxBond ? -h : h;
      moved[j] = p[j] + towards;
      this.pass(moved, this.moved, this.nearestMoved, null);
      moved[j] = p[j];
      for (let i = 0; i < out.length; i++)
        jacobian[i * this.size + j] = (this.moved[i] - out[i]) / towards;
    }
  }
}

class YoungLaplaceFit implements ProfileFit {
  readonly method = 'young-laplace' as const;
  readonly parameterNames: readonly string[];
  readonly parameters: readonly number[];
  readonly parameterSteps: readonly number[];
  constructor(
    private readonly model: YoungLaplaceModel,
    parameters: ArrayLike<number>,
    readonly converged: boolean,
    /** For the asymmetric model: the symmetric fit, reported when the sides agree. */
    readonly whole?: ProfileFit,
  ) {
    this.parameters = Array.from(parameters);
    const b = this.parameters[2];
    const names: Record<YoungLaplaceKind, string[]> = {
      symmetric: ['axisU', 'apexV', 'apexRadius', 'bond'],
      stage: ['axisU', 'apexV', 'apexRadius', 'bond', 'stageTerm'],
      sides: ['axisU', 'apexV', 'leftApexRadius', 'leftBond', 'rightApexRadius', 'rightBond'],
    };
    this.parameterNames = names[model.kind];
    this.parameterSteps = [1e-3 * b, 1e-3 * b, 1e-3 * b, 1e-3, 1e-3 * b, 1e-3].slice(0, model.size);
    if (model.kind === 'stage') this.parameterSteps = [...this.parameterSteps.slice(0, 4), 1e-3];
  }
  get kind(): YoungLaplaceKind {
    return this.model.kind;
  }
  residuals(p: readonly number[] = this.parameters): Float64Array {
    const out = new Float64Array(this.model.points.u.length);
    this.model.residuals(p, out);
    return out;
  }
  /** Where one half meets the line `baselineV` above the baseline: angle, and its x (px). */
  private sideAt(p: readonly number[], side: -1 | 1, baselineV: number) {
    const [u0, v0, b] = halfParameters(this.model.kind, p, side);
    const depth = (v0 - baselineV) / b;
    const at = profileAtDepth(this.model.profile(p, side, depth), depth);
    // A profile that closes (φ = π) above the baseline touches it at 180°.
    return { deg: at.reached ? at.phi * DEG : 180, u: u0 + side * at.x * b, at, b };
  }
  angles(p: readonly number[] = this.parameters, baselineV = 0): ContactAngles {
    const l = this.sideAt(p, -1, baselineV);
    const r = this.sideAt(p, 1, baselineV);
    return { leftDeg: l.deg, rightDeg: r.deg, leftU: l.u, rightU: r.u };
  }
  shape(): DropShape {
    const v0 = this.parameters[1];
    const l = this.sideAt(this.parameters, -1, 0);
    const r = this.sideAt(this.parameters, 1, 0);
    // Volume and area as the mean of the two halves taken as axisymmetric.
    return {
      heightPx: v0,
      apexRadiusPx: (l.b + r.b) / 2,
      bond: this.parameters[3],
      volumePx3: (l.at.volume * l.b ** 3 + r.at.volume * r.b ** 3) / 2,
      surfaceAreaPx2: (l.at.area * l.b ** 2 + r.at.area * r.b ** 2) / 2,
    };
  }
  curve(samples = 160): Array<[number, number]> | null {
    const v0 = this.parameters[1];
    const half = (side: -1 | 1): Array<[number, number]> => {
      const [u0, , b] = halfParameters(this.model.kind, this.parameters, side);
      if (!(b > 0) || !(v0 > 0)) return [];
      const profile = this.model.profile(this.parameters, side, v0 / b);
      const out: Array<[number, number]> = [];
      const step = Math.max(1, Math.floor(profile.n / samples));
      for (let i = 0; i < profile.n && profile.z[i] <= v0 / b; i += step)
        out.push([u0 + side * b * profile.x[i], v0 - b * profile.z[i]]);
      const end = profileAtDepth(profile, v0 / b);
      out.push([u0 + side * b * end.x, 0]);
      return out;
    };
    const left = half(-1);
    const right = half(1);
    return left.length && right.length ? [...left.reverse(), ...right] : null;
  }
  /** One half as [u0, v0, b, β, τ] (τ signed for that half). */
  sideParameters(side: -1 | 1): number[] {
    return halfParameters(this.model.kind, this.parameters, side);
  }
}

/** Evenly thinned subset (at most `limit` points) to keep each iteration cheap. */
function thin(points: FramePoints, limit: number): FramePoints {
  const n = points.u.length;
  if (n <= limit) return points;
  const step = n / limit;
  return subsetOf(
    points,
    Array.from({ length: limit }, (_, k) => Math.floor(k * step)),
  );
}

function fitModel(
  points: FramePoints,
  start: ArrayLike<number>,
  iterations: number,
  maxBond: number,
  kind: YoungLaplaceKind,
  whole?: ProfileFit,
  step = FIT_STEP,
): YoungLaplaceFit {
  // Residuals (and so the standard error) on an evenly thinned set: neighbouring edge points are
  // correlated, so every third or fourth point carries nearly all the information, at a fraction
  // of the cost.
  const model = new YoungLaplaceModel(points, maxBond, kind, step);
  const n = points.u.length;
  const b0 = start[2];
  const result = levenbergMarquardt(n, Array.from(start).slice(0, model.size), (p, r, jac) =>
    model.residuals(p, r, jac),
  {
    maxIterations: iterations,
    initialDamping: 1e-2,
    stepTolerance: 1e-6,
    parameterScale: [b0, b0, b0, 1, kind === 'sides' ? b0 : 1, 1],
    lower: [-Infinity, 1, 1, 0, kind === 'sides' ? 1 : -maxBond, 0],
    upper: [Infinity, Infinity, Infinity, maxBond, kind === 'sides' ? Infinity : maxBond, maxBond],
  });
  const residuals = new Float64Array(n);
  model.residuals(result.parameters, residuals);
  const converged =
    Number.isFinite(sumOfSquares(residuals)) && result.parameters.every(Number.isFinite);
  return new YoungLaplaceFit(model, result.parameters, converged, whole);
}

/**
 * The symmetric fit, then each asymmetric model started from it; the result is the asymmetric fit
 * that leaves the smaller residual, carrying the symmetric one as `whole` (see `chooseSides`).
 */
export function fitYoungLaplace(points: FramePoints, options: FitOptions = {}): ProfileFit {
  const settings = options.settings ?? DEFAULT_SETTINGS;
  const maxBond = settings.youngLaplaceMaxBond;
  const quick = options.quick === true;
  const step = quick ? QUICK_STEP : FIT_STEP;
  const previous = options.previous instanceof YoungLaplaceFit ? options.previous : null;
  const previousWhole = previous?.whole instanceof YoungLaplaceFit ? previous.whole : null;
  // An earlier frame's fit, moved into this frame: only where the iterations start changes.
  const warm = !quick && !previous ? warmParameters(options.warmStart) : null;
  let start: ArrayLike<number>;
  if (previousWhole) {
    start = previousWhole.parameters;
  } else if (warm) {
    start = warm.whole;
  } else {
    const c = fitWholeCircle(points);
    const circle = [c.cu, c.cv + c.r, c.r, 0];
    const coarse = thin(points, quick ? 120 : 240);
    // Two Bond-number starts: the circle seeds the shape, gravity flattens it.
    let best: { p: ArrayLike<number>; cost: number } = { p: circle, cost: Infinity };
    for (const bond of [0.1, 1]) {
      const seeded = [circle[0], circle[1], circle[2] / (1 + 0.4 * bond), bond];
      const trial = fitModel(coarse, seeded, quick ? 8 : 12, maxBond, 'symmetric', undefined, step);
      const cost = sumOfSquares(trial.residuals());
      if (cost < best.cost) best = { p: trial.parameters, cost };
    }
    start = best.p;
  }
  const fitted = thin(points, quick ? 200 : 500);
  const whole = fitModel(
    fitted,
    start,
    quick ? 5 : previousWhole ? 6 : 12,
    maxBond,
    'symmetric',
    undefined,
    step,
  );
  if (options.symmetricOnly) return whole;
  const [u0, v0, b, bond] = whole.parameters;
  const iterations = quick ? 6 : 10;
  // A quick fit started from a previous one keeps its model.
  const kinds: Array<'stage' | 'sides'> =
    quick && previous && previous.kind !== 'symmetric' ? [previous.kind] : ['stage', 'sides'];
  const candidates = kinds.map((kind) => {
    const seed =
      previous && previous.kind === kind
        ? previous.parameters
        : warm?.kind === kind
          ? warm.parameters
          : kind === 'stage'
          ? [u0, v0, b, bond, 0]
          : [u0, v0, b, bond, b, bond];
    const fit = fitModel(fitted, seed, iterations, maxBond, kind, whole, step);
    return { fit, cost: sumOfSquares(fit.residuals()) };
  });
  const finite = candidates.filter((c) => Number.isFinite(c.cost));
  if (!finite.length) return candidates[0].fit;
  return finite.reduce((a, c) => (c.cost < a.cost ? c : a)).fit;
}

/**
 * The parameters of an earlier frame's fit with its axis and apex moved into this frame: its
 * symmetric fit (the start of this one's) and its own model and parameters (the start of that
 * model's fit here; the other model starts from the symmetric fit as without a warm start).
 */
function warmParameters(
  warmStart: FitOptions['warmStart'],
): { whole: number[]; kind: YoungLaplaceKind; parameters: number[] } | null {
  if (!warmStart || !(warmStart.fit instanceof YoungLaplaceFit)) return null;
  const { fit, shiftU, shiftV } = warmStart;
  const moved = (p: readonly number[]) => [p[0] + shiftU, p[1] + shiftV, ...p.slice(2)];
  const whole = fit.whole instanceof YoungLaplaceFit ? fit.whole : fit;
  const finite = [...fit.parameters, ...whole.parameters].every(Number.isFinite);
  if (whole.kind !== 'symmetric' || !finite) return null;
  return { whole: moved(whole.parameters), kind: fit.kind, parameters: moved(fit.parameters) };
}

export const youngLaplaceFitter: ProfileFitter = {
  method: 'young-laplace',
  warmStarts: true,
  fit: fitYoungLaplace,
};

/** The parameters [u0, v0, b, β, τ] of each half of a Young–Laplace fit (τ signed by the half). */
export function youngLaplaceSides(fit: ProfileFit): [number[], number[]] | null {
  if (!(fit instanceof YoungLaplaceFit)) return null;
  return [fit.sideParameters(-1), fit.sideParameters(1)];
}

/**
 * Points on one half of a Young–Laplace profile (parameters [u0, v0, b, β, τ] of that half),
 * about `spacingPx` apart along it, from the apex down to `marginPx` above the baseline: a
 * stand-in for the drop's edge points without noise, for the model check of the other methods.
 * Also returns the profile's angle at the baseline.
 */
export function youngLaplaceSidePoints(
  parameters: readonly number[],
  side: -1 | 1,
  marginPx: number,
  spacingPx = 1,
): { u: number[]; v: number[]; angleDeg: number } {
  const [u0, v0, b, bond, tilt = 0] = parameters;
  const profile = integrateYoungLaplace(Math.max(bond, 0), {
    maxZ: (v0 / b) * 1.001 + 1e-3,
    step: Math.min(spacingPx / b, 0.01),
    tilt,
  });
  const u: number[] = [];
  const v: number[] = [];
  let travelled = Infinity;
  for (let i = 1; i < profile.n; i++) {
    travelled += Math.hypot(profile.x[i] - profile.x[i - 1], profile.z[i] - profile.z[i - 1]) * b;
    const height = v0 - b * profile.z[i];
    if (height < marginPx) break;
    if (travelled < spacingPx) continue;
    travelled = 0;
    u.push(u0 + side * b * profile.x[i]);
    v.push(height);
  }
  const at = profileAtDepth(profile, v0 / b);
  return { u, v, angleDeg: at.reached ? at.phi * DEG : 180 };
}
