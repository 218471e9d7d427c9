/**
 * Axisymmetric Young–Laplace profile of a sessile drop (Bashforth & Adams, 1883), in units of the
 * apex radius b, with z measured downward from the apex:
 *
 *   dx/ds = cos φ,   dz/ds = sin φ,   dφ/ds = 2 + β z − sin φ / x,
 *
 * where β = Δρ g b² / γ is the Bond number. β = 0 gives the sphere x = sin φ, z = 1 − cos φ.
 * Integrated with classical fourth-order Runge–Kutta in arc length; volume π∫x² dz and area
 * 2π∫x ds are carried as extra state so they are as accurate as the profile.
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
}

type State = [number, number, number, number, number];

function derivative(bond: number, s: State): State {
  const [x, z, phi] = s;
  const sinPhi = Math.sin(phi);
  // At the apex sin φ / x → dφ/ds = 1; x is never below the series start, but guard anyway.
  const curvatureTerm = x > 1e-12 ? sinPhi / x : 1;
  return [
    Math.cos(phi),
    sinPhi,
    2 + bond * z - curvatureTerm,
    Math.PI * x * x * sinPhi,
    2 * Math.PI * x,
  ];
}

function rk4(bond: number, s: State, h: number): State {
  const k1 = derivative(bond, s);
  const s2 = s.map((v, i) => v + (h / 2) * k1[i]) as State;
  const k2 = derivative(bond, s2);
  const s3 = s.map((v, i) => v + (h / 2) * k2[i]) as State;
  const k3 = derivative(bond, s3);
  const s4 = s.map((v, i) => v + h * k3[i]) as State;
  const k4 = derivative(bond, s4);
  return s.map((v, i) => v + (h / 6) * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i])) as State;
}

/** Default arc-length step: fine enough for the capillary length 1/√β at large Bond numbers. */
export function defaultStep(bond: number): number {
  return 0.004 / Math.max(1, Math.sqrt(Math.max(bond, 0)));
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
  const capacity = 200_000;
  const xs: number[] = [0];
  const zs: number[] = [0];
  const phis: number[] = [0];
  const vols: number[] = [0];
  const areas: number[] = [0];
  // Series start near the apex: x ≈ s, z ≈ s²/2, φ ≈ s (curvature 1 at the apex in units of b).
  const s0 = Math.min(h, 1e-4);
  let state: State = [s0, (s0 * s0) / 2, s0, (Math.PI * s0 ** 4) / 8, Math.PI * s0 * s0];
  xs.push(state[0]);
  zs.push(state[1]);
  phis.push(state[2]);
  vols.push(state[3]);
  areas.push(state[4]);
  for (let i = 0; i < capacity; i++) {
    const next = rk4(bond, state, h);
    if (next[2] >= maxPhi) {
      // Partial step landing on φ = maxPhi (secant iterations on the step length).
      let lo = 0;
      let hi = h;
      let phiLo = state[2];
      let phiHi = next[2];
      let landed = next;
      for (let k = 0; k < 30; k++) {
        const t = lo + ((maxPhi - phiLo) / (phiHi - phiLo)) * (hi - lo);
        landed = rk4(bond, state, t);
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
      state = landed;
      xs.push(state[0]);
      zs.push(state[1]);
      phis.push(maxPhi);
      vols.push(state[3]);
      areas.push(state[4]);
      break;
    }
    state = next;
    xs.push(state[0]);
    zs.push(state[1]);
    phis.push(state[2]);
    vols.push(state[3]);
    areas.push(state[4]);
    if (state[1] > maxZ) break;
  }
  return {
    bond,
    n: xs.length,
    x: Float64Array.from(xs),
    z: Float64Array.from(zs),
    phi: Float64Array.from(phis),
    volume: Float64Array.from(vols),
    area: Float64Array.from(areas),
  };
}

/** Index k with z[k] ≤ depth < z[k+1] (z increases along a sessile profile); −1 if above the apex. */
export function findDepthIndex(profile: YoungLaplaceProfile, depth: number): number {
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
