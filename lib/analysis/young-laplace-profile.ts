/**
 * Axisymmetric Young–Laplace profile of a sessile drop (Bashforth & Adams, 1883), in units of the
 * apex radius b, with z measured downward from the apex:
 *
 *   dx/ds = cos φ,   dz/ds = sin φ,   dφ/ds = 2 + β z − sin φ / x,
 *
 * where β = Δρ g b² / γ is the Bond number. β = 0 gives the sphere x = sin φ, z = 1 − cos φ.
 * Integrated with classical fourth-order Runge–Kutta in arc length; volume π∫x² dz and area
 * 2π∫x ds are carried as extra state so they are as accurate as the profile.
 *
 * On a stage inclined by α against gravity the hydrostatic term gains a component along the stage:
 * dφ/ds = 2 + β z + τ x − sin φ / x, with β = Δρ g b² cos α / γ and τ = ± Δρ g b² sin α / γ (+ on
 * the downhill half, − uphill), each half integrated on its own from the common apex with the
 * azimuthal curvature of an axisymmetric drop (the usual quasi-axisymmetric approximation; exact at
 * α = 0, and smooth at the apex, where the extra term vanishes). `tilt` (τ) selects it.
 */

export interface YoungLaplaceProfile {
  bond: number;
  /** Node count. */
  n: number;
  x: Float64Array;
  z: Float64Array;
  phi: Float64Array;
  /** Cumulative volume π∫x² dz from the apex (units b³). */
  volume: Float64Array;
  /** Cumulative surface area 2π∫x ds from the apex (units b²). */
  area: Float64Array;
}

export interface IntegrateOptions {
  /** Stop once φ reaches this angle (radians, ≤ π). */
  maxPhi?: number;
  /** Stop once z exceeds this depth (units of b). */
  maxZ?: number;
  /** Arc-length step; by default scaled with the capillary length for large β. */
  step?: number;
  /** τ, the hydrostatic term along an inclined stage (units of 1/b², signed by the half). */
  tilt?: number;
}

/** Default arc-length step: fine enough for the capillary length 1/√β at large Bond numbers. */
export function defaultStep(bond: number): number {
  return 0.004 / Math.max(1, Math.sqrt(Math.max(bond, 0)));
}

// One RK4 step of the five-component state, without allocating (the fits integrate thousands of
// profiles per drag). `out` may be `state`.
const k1 = new Float64Array(5);
const k2 = new Float64Array(5);
const k3 = new Float64Array(5);
const k4 = new Float64Array(5);
const mid = new Float64Array(5);

function derivative(bond: number, tilt: number, s: Float64Array, out: Float64Array): void {
  const x = s[0];
  const phi = s[2];
  const sinPhi = Math.sin(phi);
  // At the apex sin φ / x → dφ/ds = 1; x is never below the series start, but guard anyway.
  const curvatureTerm = x > 1e-12 ? sinPhi / x : 1;
  out[0] = Math.cos(phi);
  out[1] = sinPhi;
  out[2] = 2 + bond * s[1] + tilt * x - curvatureTerm;
  out[3] = Math.PI * x * x * sinPhi;
  out[4] = 2 * Math.PI * x;
}

function rk4(bond: number, tilt: number, s: Float64Array, h: number, out: Float64Array): void {
  derivative(bond, tilt, s, k1);
  for (let i = 0; i < 5; i++) mid[i] = s[i] + (h / 2) * k1[i];
  derivative(bond, tilt, mid, k2);
  for (let i = 0; i < 5; i++) mid[i] = s[i] + (h / 2) * k2[i];
  derivative(bond, tilt, mid, k3);
  for (let i = 0; i < 5; i++) mid[i] = s[i] + h * k3[i];
  derivative(bond, tilt, mid, k4);
  for (let i = 0; i < 5; i++) out[i] = s[i] + (h / 6) * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]);
}

/** Growable columns of the profile. */
class Columns {
  n = 0;
  x: Float64Array;
  z: Float64Array;
  phi: Float64Array;
  volume: Float64Array;
  area: Float64Array;
  constructor(capacity: number) {
    this.x = new Float64Array(capacity);
    this.z = new Float64Array(capacity);
    this.phi = new Float64Array(capacity);
    this.volume = new Float64Array(capacity);
    this.area = new Float64Array(capacity);
  }
  push(x: number, z: number, phi: number, volume: number, area: number): void {
    if (this.n === this.x.length) {
      const grow = (a: Float64Array) => {
        const b = new Float64Array(a.length * 2);
        b.set(a);
        return b;
      };
      this.x = grow(this.x);
      this.z = grow(this.z);
      this.phi = grow(this.phi);
      this.volume = grow(this.volume);
      this.area = grow(this.area);
    }
    this.x[this.n] = x;
    this.z[this.n] = z;
    this.phi[this.n] = phi;
    this.volume[this.n] = volume;
    this.area[this.n] = area;
    this.n++;
  }
}

/**
 * Integrates the profile from the apex until φ reaches `maxPhi` (default π) or z exceeds `maxZ`.
 * When stopped by `maxPhi`, the last node lies exactly at φ = maxPhi (a final partial step).
 */
export function integrateYoungLaplace(
  bond: number,
  options: IntegrateOptions = {},
): YoungLaplaceProfile {
  const maxPhi = Math.min(options.maxPhi ?? Math.PI, Math.PI);
  const maxZ = options.maxZ ?? Number.POSITIVE_INFINITY;
  const h = options.step ?? defaultStep(bond);
  const tilt = options.tilt ?? 0;
  const capacity = 200_000;
  const columns = new Columns(Math.min(capacity, Math.ceil(4 / h) + 8));
  columns.push(0, 0, 0, 0, 0);
  // Series start near the apex: x ≈ s, z ≈ s²/2, φ ≈ s (curvature 1 at the apex in units of b).
  const s0 = Math.min(h, 1e-4);
  const state = Float64Array.of(s0, (s0 * s0) / 2, s0, (Math.PI * s0 ** 4) / 8, Math.PI * s0 * s0);
  const next = new Float64Array(5);
  columns.push(state[0], state[1], state[2], state[3], state[4]);
  for (let i = 0; i < capacity; i++) {
    rk4(bond, tilt, state, h, next);
    if (next[2] >= maxPhi) {
      // Partial step landing on φ = maxPhi (secant iterations on the step length).
      let lo = 0;
      let hi = h;
      let phiLo = state[2];
      let phiHi = next[2];
      const landed = new Float64Array(next);
      for (let k = 0; k < 30; k++) {
        const t = lo + ((maxPhi - phiLo) / (phiHi - phiLo)) * (hi - lo);
        rk4(bond, tilt, state, t, landed);
        const err = landed[2] - maxPhi;
        if (Math.abs(err) < 1e-13) break;
        if (err > 0) {
          hi = t;
          phiHi = landed[2];
        } else {
          lo = t;
          phiLo = landed[2];
        }
      }
      columns.push(landed[0], landed[1], maxPhi, landed[3], landed[4]);
      break;
    }
    state.set(next);
    columns.push(state[0], state[1], state[2], state[3], state[4]);
    if (state[1] > maxZ) break;
  }
  const n = columns.n;
  return {
    bond,
    n,
    x: columns.x.subarray(0, n),
    z: columns.z.subarray(0, n),
    phi: columns.phi.subarray(0, n),
    volume: columns.volume.subarray(0, n),
    area: columns.area.subarray(0, n),
  };
}

/** Index k with z[k] ≤ depth < z[k+1] (z increases along a sessile profile); −1 if above the apex. */
export function findDepthIndex(profile: Pick<YoungLaplaceProfile, 'z' | 'n'>, depth: number): number {
  const { z, n } = profile;
  if (depth < z[0]) return -1;
  if (depth >= z[n - 1]) return n - 1;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (z[mid] <= depth) lo = mid;
    else hi = mid;
  }
  return lo;
}

export interface ProfileAtDepth {
  x: number;
  phi: number;
  volume: number;
  area: number;
  /** False when the profile ends (φ = π) above this depth. */
  reached: boolean;
}

/** Linear interpolation of the profile quantities at a depth z below the apex. */
export function profileAtDepth(profile: YoungLaplaceProfile, depth: number): ProfileAtDepth {
  const k = findDepthIndex(profile, depth);
  const last = profile.n - 1;
  if (k >= last) {
    return {
      x: profile.x[last],
      phi: profile.phi[last],
      volume: profile.volume[last],
      area: profile.area[last],
      reached: Math.abs(profile.z[last] - depth) < 1e-9,
    };
  }
  const kk = Math.max(k, 0);
  const t = (depth - profile.z[kk]) / (profile.z[kk + 1] - profile.z[kk]);
  const lerp = (a: Float64Array) => a[kk] + t * (a[kk + 1] - a[kk]);
  return {
    x: lerp(profile.x),
    phi: lerp(profile.phi),
    volume: lerp(profile.volume),
    area: lerp(profile.area),
    reached: true,
  };
}

/** Profile of a sessile drop with contact angle θ (radians): the apex-to-contact-line curve. */
export function sessileDropProfile(bond: number, contactAngleRad: number): YoungLaplaceProfile {
  return integrateYoungLaplace(bond, { maxPhi: contactAngleRad });
}
