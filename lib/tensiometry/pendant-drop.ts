import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { integrateYoungLaplace, type YoungLaplaceProfile } from '../analysis/young-laplace-profile';
import { STANDARD_GRAVITY } from './wilhelmy';
import { TensiometryInputError, requirePositive } from './errors';

/*
 * Pendant-drop surface tension (axisymmetric drop shape analysis): the hanging drop's edge is
 * fitted with the Young–Laplace profile of lib/analysis (Bashforth & Adams 1883). With the apex
 * at the bottom and z measured upward, the profile obeys dφ/ds = 2 − β z − sin φ / x, which is
 * lib/analysis's sessile-drop equation with the Bond number −β; the fit gives the apex radius b
 * and the shape factor β, and γ = Δρ g b² / β.
 */

/** An edge point of the drop in image pixels (y downward, the drop hanging with its apex lowest). */
export interface EdgePoint {
  x: number;
  y: number;
}

export interface PendantDropInput {
  /** Edge points of both sides of the drop below the needle, px. */
  edge: readonly EdgePoint[];
  /** Outer diameter of the needle, mm (the scale). */
  needleOuterDiameterMm: number;
  /** The needle's outer diameter as seen in the photo, px. */
  needleOuterDiameterPx: number;
  /** Density of the drop minus that of the surrounding phase, kg/m³ (positive for a hanging drop). */
  densityDifferenceKgPerM3: number;
  /** Gravity, m/s² (default 9.80665). */
  gravityMPerS2?: number;
}

export interface PendantDropResult {
  method: 'Pendant drop, Young–Laplace fit (Bashforth & Adams 1883): γ = Δρ g b² / β';
  surfaceTensionMilliNewtonPerM: number;
  /** Apex radius of curvature b, mm. */
  apexRadiusMm: number;
  /** Shape factor (Bond number) β = Δρ g b² / γ. */
  shapeFactor: number;
  /** Apex position and axis in the photo, px. */
  apex: { x: number; y: number };
  /** Root-mean-square distance of the edge points from the fitted profile, px. */
  rmsResidualPx: number;
  scaleMmPerPx: number;
  pointCount: number;
  warnings: string[];
}

/** Arc-length step of the fit's profiles, units of b (RK4 error ~1e−8 b, far below a pixel). */
const FIT_STEP = 0.01;

/** Below this shape factor the drop is close to a sphere and its shape barely depends on γ. */
export const MIN_RELIABLE_SHAPE_FACTOR = 0.15;

/**
 * Pendant profile in units of b (x radial, z height above the apex), integrated up to `maxZ`.
 * Stops early if the tangent turns past horizontal (φ = π), as for a drop that would pinch off.
 */
export function pendantProfile(
  shapeFactor: number,
  maxZ: number,
  step?: number,
): YoungLaplaceProfile {
  return integrateYoungLaplace(-shapeFactor, { maxZ, step });
}

/** Index of the largest k with z[k] ≤ h (z rises monotonically while φ < π). */
function indexAtHeight(z: Float64Array, n: number, h: number): number {
  let lo = 0;
  let hi = n - 1;
  if (h <= z[0]) return 0;
  if (h >= z[hi]) return hi;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (z[mid] <= h) lo = mid;
    else hi = mid;
  }
  return lo;
}

function segmentDistance(
  px: number,
  pz: number,
  ax: number,
  az: number,
  bx: number,
  bz: number,
): number {
  const dx = bx - ax;
  const dz = bz - az;
  const len2 = dx * dx + dz * dz;
  const t = len2 > 0 ? Math.min(1, Math.max(0, ((px - ax) * dx + (pz - az) * dz) / len2)) : 0;
  return Math.hypot(px - (ax + t * dx), pz - (az + t * dz));
}

/**
 * Distance of a point (r ≥ 0, h) from the profile polyline, signed: positive outside the drop.
 * Starts at the node of equal height and walks along the curve while the distance falls.
 */
function distanceToProfile(profile: YoungLaplaceProfile, r: number, h: number): number {
  const { x, z, n } = profile;
  const d2 = (k: number) => (x[k] - r) ** 2 + (z[k] - h) ** 2;
  let k = indexAtHeight(z, n, h);
  while (k > 0 && d2(k - 1) < d2(k)) k--;
  while (k < n - 1 && d2(k + 1) < d2(k)) k++;
  let best = Number.POSITIVE_INFINITY;
  if (k > 0) best = Math.min(best, segmentDistance(r, h, x[k - 1], z[k - 1], x[k], z[k]));
  if (k < n - 1) best = Math.min(best, segmentDistance(r, h, x[k], z[k], x[k + 1], z[k + 1]));
  if (!Number.isFinite(best)) best = Math.sqrt(d2(k));
  // Outside when farther from the axis than the profile at that height (or below the apex).
  const outside = h < 0 || r > x[k];
  return outside ? best : -best;
}

type Params = [x0: number, y0: number, b: number, beta: number];

function residuals(edge: readonly EdgePoint[], params: Params, heightPx: number): number[] {
  const [x0, y0, b, beta] = params;
  if (!(b > 0) || !(beta > 0)) return edge.map(() => 1e3);
  // Just above the highest point: beyond the drop's own height a trial profile can curl back
  // (φ < 0) and the integrator would run to its step limit.
  const profile = pendantProfile(beta, heightPx / b + 0.05, FIT_STEP);
  return edge.map((p) => b * distanceToProfile(profile, Math.abs(p.x - x0) / b, (y0 - p.y) / b));
}

const rms = (values: readonly number[]) =>
  Math.sqrt(values.reduce((s, v) => s + v * v, 0) / Math.max(1, values.length));

/**
 * Fits the Young–Laplace pendant profile to the drop's edge and returns γ = Δρ g b² / β with the
 * fit's RMS residual. Start: the axis midway between the widest points, the apex at the lowest
 * point, b from the equatorial radius for each β of a coarse scan; then Levenberg–Marquardt on
 * (axis, apex height, b, β).
 */
export function fitPendantDrop(input: PendantDropInput): PendantDropResult {
  const { edge } = input;
  requirePositive(input.needleOuterDiameterMm, 'Needle outer diameter (mm)');
  requirePositive(input.needleOuterDiameterPx, 'Needle outer diameter in the photo (px)');
  requirePositive(input.densityDifferenceKgPerM3, 'Density difference (kg/m³)');
  const gravity = input.gravityMPerS2 ?? STANDARD_GRAVITY;
  requirePositive(gravity, 'Gravity (m/s²)');
  if (!Array.isArray(edge) || edge.length < 20) {
    throw new TensiometryInputError(
      'too-few-points',
      `The drop's edge has ${edge?.length ?? 0} points; at least 20 are needed. Use a sharper, backlit photo with the whole drop in view.`,
    );
  }
  if (edge.some((p) => !Number.isFinite(p.x) || !Number.isFinite(p.y))) {
    throw new TensiometryInputError(
      'not-finite',
      'An edge point is not a number; check the edge data.',
    );
  }

  let minX = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  let minY = Infinity;
  for (const p of edge) {
    minX = Math.min(minX, p.x);
    maxX = Math.max(maxX, p.x);
    maxY = Math.max(maxY, p.y);
    minY = Math.min(minY, p.y);
  }
  const x0 = (minX + maxX) / 2;
  const equatorRadius = (maxX - minX) / 2;
  const heightPx = maxY - minY;
  if (!(equatorRadius > 0) || !(heightPx > 0)) {
    throw new TensiometryInputError(
      'degenerate',
      'The edge points do not outline a drop; check the edge data.',
    );
  }

  // Coarse scan of β; b follows from the equatorial radius of each trial profile.
  let start: Params = [x0, maxY, equatorRadius, 0.2];
  let startCost = Infinity;
  for (let beta = 0.03; beta <= 0.6; beta += 0.03) {
    // Up to the equator (φ = π/2), where x is largest.
    const probe = integrateYoungLaplace(-beta, { maxPhi: Math.PI / 2, step: 0.02 });
    const b = equatorRadius / probe.x[probe.n - 1];
    const params: Params = [x0, maxY, b, beta];
    const cost = rms(residuals(edge, params, heightPx));
    if (cost < startCost) {
      startCost = cost;
      start = params;
    }
  }

  const indices = edge.map((_, i) => i);
  const fit = levenbergMarquardt(
    { x: indices, y: indices.map(() => 0) },
    (p: number[]) => {
      const r = residuals(edge, p as Params, heightPx);
      return (i: number) => r[i];
    },
    {
      initialValues: start,
      damping: 1e-2,
      gradientDifference: [1e-3, 1e-3, 1e-3, 1e-5],
      maxIterations: 60,
      errorTolerance: 1e-10,
      minValues: [minX, minY, equatorRadius * 0.2, 1e-3],
      maxValues: [maxX, maxY + equatorRadius, equatorRadius * 5, 1],
    },
  );
  const params = fit.parameterValues as Params;
  const [ax, ay, bPx, beta] = params;
  const finalResiduals = residuals(edge, params, heightPx);
  const rmsPx = rms(finalResiduals);

  const scaleMmPerPx = input.needleOuterDiameterMm / input.needleOuterDiameterPx;
  const bMm = bPx * scaleMmPerPx;
  const gamma = ((input.densityDifferenceKgPerM3 * gravity * (bMm * 1e-3) ** 2) / beta) * 1e3;

  const warnings: string[] = [];
  if (beta < MIN_RELIABLE_SHAPE_FACTOR) {
    warnings.push(
      `The drop is too round (shape factor β = ${beta.toFixed(3)} < ${MIN_RELIABLE_SHAPE_FACTOR}): its shape hardly depends on the surface tension, so γ is unreliable. Hang a larger drop, close to detaching (common practice).`,
    );
  }
  if (rmsPx > 1) {
    warnings.push(
      `The edge fits the Young–Laplace profile poorly (RMS ${rmsPx.toFixed(2)} px); check the edge for the needle, reflections or a tilted camera.`,
    );
  }
  const equatorPx = equatorRadius * 2;
  if (equatorPx / input.needleOuterDiameterPx < 1.2) {
    warnings.push(
      'The drop is barely wider than the needle; hang a larger drop for a reliable fit.',
    );
  }
  return {
    method: 'Pendant drop, Young–Laplace fit (Bashforth & Adams 1883): γ = Δρ g b² / β',
    surfaceTensionMilliNewtonPerM: gamma,
    apexRadiusMm: bMm,
    shapeFactor: beta,
    apex: { x: ax, y: ay },
    rmsResidualPx: rmsPx,
    scaleMmPerPx,
    pointCount: edge.length,
    warnings,
  };
}

/**
 * The fitted Young–Laplace profile in image pixels, for drawing over the photo: from the height
 * `topY` (px, e.g. the needle tip) down the left side to the apex and up the right side, about
 * `pointsPerSide` points each. Coordinates as pendantEdgeFromImage gives the edge: pixel centres
 * at whole numbers (a drawing whose pixel edges are at whole numbers adds 0.5). Recomputed from
 * the fit's apex, b and β, so nothing extra has to be kept.
 */
export function fittedPendantOutline(
  result: Pick<PendantDropResult, 'apex' | 'apexRadiusMm' | 'scaleMmPerPx' | 'shapeFactor'>,
  topY: number,
  pointsPerSide = 120,
): EdgePoint[] {
  const bPx = result.apexRadiusMm / result.scaleMmPerPx;
  const heightPx = result.apex.y - topY;
  if (!(bPx > 0) || !(heightPx > 0) || !(result.shapeFactor > 0)) return [];
  const profile = pendantProfile(result.shapeFactor, heightPx / bPx);
  const every = Math.max(1, Math.floor(profile.n / pointsPerSide));
  const side: { u: number; v: number }[] = [];
  for (let k = 0; k < profile.n; k += every) side.push({ u: profile.x[k], v: profile.z[k] });
  const last = profile.n - 1;
  if (last % every !== 0) side.push({ u: profile.x[last], v: profile.z[last] });
  const at = (u: number, v: number, sign: number) => ({
    x: result.apex.x + sign * u * bPx,
    y: result.apex.y - v * bPx,
  });
  return [
    ...side
      .slice()
      .reverse()
      .map(({ u, v }) => at(u, v, -1)),
    ...side.slice(1).map(({ u, v }) => at(u, v, 1)),
  ];
}

/** A grayscale photo: width × height values, row by row (8 or 16 bit). */
export interface PendantPhoto {
  width: number;
  height: number;
  data: ArrayLike<number>;
}

export interface PendantEdgeExtraction {
  /** Edge points of the drop below the needle, px (sub-pixel, at the half-contrast level). */
  edge: EdgePoint[];
  /** Outer diameter of the needle in the photo, px (median width of its rows). */
  needleOuterDiameterPx: number;
  /** Row where the drop leaves the needle, px. */
  needleTipY: number;
  warnings: string[];
}

/**
 * The hanging drop's outline in a backlit photo (dark drop and needle on a bright background,
 * needle entering from the top): each row's left and right crossing of the half-contrast level,
 * interpolated between pixels, and, near the apex where rows graze the edge, each column's
 * lowest crossing. The needle's width is the median width of the top rows; the drop begins
 * where the outline leaves that width.
 */
export function pendantEdgeFromImage(photo: PendantPhoto): PendantEdgeExtraction {
  const { width, height, data } = photo;
  if (!(width > 8 && height > 8) || data.length < width * height) {
    throw new TensiometryInputError(
      'bad-image',
      'The photo is too small or incomplete; use the full backlit photo of the hanging drop.',
    );
  }
  const sorted = Float64Array.from(
    { length: Math.min(data.length, 20_000) },
    (_, i) => data[Math.floor((i * data.length) / Math.min(data.length, 20_000))],
  ).sort();
  const dark = sorted[Math.floor(sorted.length * 0.02)];
  const bright = sorted[Math.floor(sorted.length * 0.98)];
  if (!(bright - dark > 0)) {
    throw new TensiometryInputError(
      'low-contrast',
      'The photo has no contrast between drop and background; use a backlit photo.',
    );
  }
  const level = (dark + bright) / 2;
  const at = (x: number, y: number) => data[y * width + x];
  const cross = (a: number, b: number) => (level - a) / (b - a);

  type Row = { y: number; left: number; right: number };
  const rows: Row[] = [];
  for (let y = 0; y < height; y++) {
    let first = -1;
    let last = -1;
    for (let x = 0; x < width; x++) {
      if (at(x, y) < level) {
        if (first < 0) first = x;
        last = x;
      }
    }
    if (first <= 0 || last >= width - 1) {
      if (rows.length > 0 && first < 0) break; // below the apex
      continue;
    }
    rows.push({
      y,
      left: first - 1 + cross(at(first - 1, y), at(first, y)),
      right: last + cross(at(last, y), at(last + 1, y)),
    });
  }
  if (rows.length < 20) {
    throw new TensiometryInputError(
      'no-drop',
      'No hanging drop was found: the photo needs a dark drop and needle on a bright background, the needle entering from the top and the whole drop in view.',
    );
  }
  const widths = rows.map((r) => r.right - r.left);
  const top = widths.slice(0, Math.max(3, Math.floor(rows.length * 0.08))).sort((a, b) => a - b);
  const needleWidth = top[Math.floor(top.length / 2)];
  let start = 0;
  while (start < rows.length && Math.abs(widths[start] - needleWidth) <= 1.5) start++;
  // Leave two rows at the needle's tip, where its corner blurs into the drop.
  start = Math.min(rows.length - 1, start + 2);
  const dropRows = rows.slice(start);
  const warnings: string[] = [];
  if (start < 3)
    warnings.push(
      'Little or no needle is visible above the drop; the scale from its diameter may be wrong.',
    );
  const edge: EdgePoint[] = [];
  for (const r of dropRows) edge.push({ x: r.left, y: r.y }, { x: r.right, y: r.y });

  // Near the apex the rows graze the outline; columns cross it steeply there.
  const bottomY = dropRows[dropRows.length - 1].y;
  const dropHeight = bottomY - dropRows[0].y;
  const lowest = dropRows.filter((r) => r.y >= bottomY - dropHeight * 0.15);
  const from = Math.ceil(Math.min(...lowest.map((r) => r.left)));
  const to = Math.floor(Math.max(...lowest.map((r) => r.right)));
  for (let x = from; x <= to; x++) {
    for (let y = Math.min(height - 2, bottomY + 2); y > bottomY - dropHeight * 0.15; y--) {
      if (at(x, y) < level && at(x, y + 1) >= level) {
        edge.push({ x, y: y + cross(at(x, y), at(x, y + 1)) });
        break;
      }
    }
  }
  return { edge, needleOuterDiameterPx: needleWidth, needleTipY: dropRows[0].y, warnings };
}
