import sharp from 'sharp';
import { integrateYoungLaplace } from '@/lib/analysis/young-laplace-profile';

/** Standard gravity, m/s² (CGPM 1901), as lib/tensiometry uses by default. */
const G = 9.80665;

export interface PendantPhotoSpec {
  /** γ the drop is rendered at, mN/m. */
  surfaceTensionMilliNewtonPerM: number;
  densityDifferenceKgPerM3: number;
  /** Apex radius of curvature b, mm. */
  apexRadiusMm: number;
  pxPerMm: number;
  needleOuterDiameterMm: number;
  width: number;
  height: number;
  /** The drop's axis and apex in the photo, px (off the pixel grid on purpose). */
  axisX: number;
  apexY: number;
}

/** A hanging water drop (γ = 72.0 mN/m, Δρ = 997 kg/m³, b = 1.35 mm) at 60 px/mm. */
export const WATER_PENDANT: PendantPhotoSpec = {
  surfaceTensionMilliNewtonPerM: 72.0,
  densityDifferenceKgPerM3: 997,
  apexRadiusMm: 1.35,
  pxPerMm: 60,
  needleOuterDiameterMm: 1.2,
  width: 320,
  height: 360,
  axisX: 160.3,
  apexY: 330.6,
};

/**
 * A backlit photo of a drop hanging from a needle, rendered from the Young–Laplace equation
 * (Bashforth & Adams 1883) at a known γ: β = Δρ g b² / γ, the profile integrated with a fine
 * step up to where it narrows to the needle, then the needle up to the top edge; dark (30) on
 * bright (230), 4 × 4 supersampled so the outline is anti-aliased. Gray, one byte per pixel.
 */
export function renderPendantPhoto(spec: PendantPhotoSpec = WATER_PENDANT) {
  const bM = spec.apexRadiusMm * 1e-3;
  const beta =
    (spec.densityDifferenceKgPerM3 * G * bM * bM) / (spec.surfaceTensionMilliNewtonPerM * 1e-3);
  const profile = integrateYoungLaplace(-beta, { maxZ: 6, step: 0.0005 });
  const bPx = spec.apexRadiusMm * spec.pxPerMm;
  const needleRadiusPx = (spec.needleOuterDiameterMm / 2) * spec.pxPerMm;
  // Radius against height above the apex (px), up to where the drop narrows to the needle.
  const radius: { h: number; r: number }[] = [];
  let pastEquator = false;
  for (let k = 0; k < profile.n; k++) {
    const r = profile.x[k] * bPx;
    if (profile.phi[k] > Math.PI / 2) pastEquator = true;
    if (pastEquator && r <= needleRadiusPx) break;
    radius.push({ h: profile.z[k] * bPx, r });
  }
  const dropTop = radius[radius.length - 1].h;
  const inside = (x: number, y: number) => {
    const h = spec.apexY - y;
    if (h < 0) return false;
    if (h > dropTop) return Math.abs(x - spec.axisX) <= needleRadiusPx;
    let lo = 0;
    let hi = radius.length - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (radius[mid].h <= h) lo = mid;
      else hi = mid;
    }
    const t = (h - radius[lo].h) / (radius[hi].h - radius[lo].h || 1);
    return Math.abs(x - spec.axisX) <= radius[lo].r + t * (radius[hi].r - radius[lo].r);
  };
  const { width, height } = spec;
  const data = new Uint8Array(width * height);
  for (let y = 0; y < height; y++)
    for (let x = 0; x < width; x++) {
      let covered = 0;
      for (let sy = 0; sy < 4; sy++)
        for (let sx = 0; sx < 4; sx++)
          if (inside(x + (sx + 0.5) / 4, y + (sy + 0.5) / 4)) covered++;
      data[y * width + x] = Math.round(230 - (covered / 16) * 200);
    }
  return { width, height, data, needleOuterDiameterPx: 2 * needleRadiusPx, spec };
}

/** The rendered photo as an 8-bit gray PNG, as a camera export would be uploaded. */
export async function pendantPhotoPng(spec: PendantPhotoSpec = WATER_PENDANT): Promise<Buffer> {
  const { width, height, data } = renderPendantPhoto(spec);
  return sharp(Buffer.from(data), { raw: { width, height, channels: 1 } })
    .png()
    .toBuffer();
}

/** A uniformly lit frame with nothing in it: no drop to find. */
export async function blankPhotoPng(width = 320, height = 360): Promise<Buffer> {
  return sharp(Buffer.alloc(width * height, 230), { raw: { width, height, channels: 1 } })
    .png()
    .toBuffer();
}

/**
 * The traced outline of a hanging water drop (γ = 72.0 mN/m, Δρ = 997 kg/m³, b = 1.35 mm, at
 * 120 px/mm) with exactly `count` points, half on each side, as the pendant-drop route takes it
 * (`edge`, px, y downward), from the Young–Laplace equation (Bashforth & Adams 1883). The
 * request body it belongs to is `pendantEdgeBody(count)`.
 */
export function pendantEdge(count: number): { x: number; y: number }[] {
  const b = 1.35e-3;
  const beta = (997 * G * b * b) / 0.072;
  const profile = integrateYoungLaplace(-beta, { maxZ: 6, step: 0.0002 });
  const bPx = 1.35 * 120;
  // The outline up to where it turns back in towards the needle.
  let last = 1;
  let xmax = 0;
  for (let k = 1; k < profile.n; k++) {
    xmax = Math.max(xmax, profile.x[k]);
    if (profile.phi[k] > Math.PI / 2 && profile.x[k] < 0.6 * xmax) break;
    last = k;
  }
  const perSide = Math.ceil(count / 2);
  const points: { x: number; y: number }[] = [];
  for (let i = 0; i < perSide; i++) {
    // Sub-sample positions along the arc, interpolated between the profile's steps.
    const at = 1 + ((last - 1) * i) / Math.max(1, perSide - 1);
    const k = Math.min(last - 1, Math.floor(at));
    const f = at - k;
    const x = profile.x[k] + f * (profile.x[k + 1] - profile.x[k]);
    const z = profile.z[k] + f * (profile.z[k + 1] - profile.z[k]);
    for (const side of [1, -1]) points.push({ x: 400 + side * x * bPx, y: 600 - z * bPx });
  }
  return points.slice(0, count);
}

/** A pendant-drop request body with a traced outline of `count` points (see pendantEdge). */
export function pendantEdgeBody(count: number) {
  return {
    edge: pendantEdge(count),
    needleOuterDiameterMm: 1.2,
    needleOuterDiameterPx: 144,
    densityDifferenceKgPerM3: 997,
  };
}
