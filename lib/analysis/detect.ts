/**
 * From pixels to sub-pixel profile points: denoise, Otsu split of dark silhouette and bright
 * backlight, Canny edges (thresholds from the measured contrast), automatic baseline, silhouette
 * contour above the baseline with needle removal, sub-pixel refinement and outlier rejection.
 */
import type { OpenCv, CvMat, CvMatVector } from './opencv';
import { toUint8, type FloatImage } from './image';
import { edgeAlongNormal } from './subpixel';
import { BaselineFrame } from './frame';
import { seededRandomForAnalysis } from './random';
import type { Baseline, Point } from './types';

export interface EdgeMaps {
  width: number;
  height: number;
  blurred: Uint8Array;
  darkMask: Uint8Array;
  edges: Uint8Array;
  threshold: number;
  darkLevel: number;
  brightLevel: number;
  /** Robust noise estimate of the background (0–255 scale). */
  noise: number;
}

/** Denoising scale: about one pixel, growing slowly for very large images. */
export function denoiseSigma(width: number, height: number): number {
  return Math.max(1, Math.min(width, height) / 800);
}

/** Half-length of the sub-pixel search along the normal: covers the edge blur of large images. */
function searchWindow(width: number, height: number): number {
  return Math.max(4, 2.5 * denoiseSigma(width, height));
}

/** OpenCV part: Gaussian denoise, Otsu threshold, Canny. Every Mat is deleted before returning. */
export function computeEdgeMaps(cv: OpenCv, image: FloatImage): EdgeMaps {
  const { width, height } = image;
  const mats: (CvMat | CvMatVector)[] = [];
  const track = <T extends CvMat | CvMatVector>(m: T): T => {
    mats.push(m);
    return m;
  };
  try {
    const src = track(new cv.Mat(height, width, cv.CV_8UC1));
    src.data.set(toUint8(image));
    const blur = track(new cv.Mat());
    const sigma = denoiseSigma(width, height);
    cv.GaussianBlur(src, blur, new cv.Size(0, 0), sigma, sigma, cv.BORDER_REPLICATE);
    const mask = track(new cv.Mat());
    const threshold = cv.threshold(blur, mask, 0, 255, cv.THRESH_BINARY_INV + cv.THRESH_OTSU);
    const blurred = blur.data.slice();
    const darkMask = mask.data.slice();
    let darkSum = 0;
    let darkCount = 0;
    let brightSum = 0;
    let brightCount = 0;
    for (let i = 0; i < blurred.length; i++) {
      if (darkMask[i]) {
        darkSum += blurred[i];
        darkCount++;
      } else {
        brightSum += blurred[i];
        brightCount++;
      }
    }
    const darkLevel = darkCount ? darkSum / darkCount : 0;
    const brightLevel = brightCount ? brightSum / brightCount : 255;
    const contrast = Math.max(brightLevel - darkLevel, 1);
    // Canny thresholds from the image's own contrast (Sobel response of a blurred step ≈ 1–2 × contrast).
    const edgesMat = track(new cv.Mat());
    cv.Canny(blur, edgesMat, 0.15 * contrast, 0.3 * contrast, 3, true);
    const edges = edgesMat.data.slice();
    return {
      width,
      height,
      blurred,
      darkMask,
      edges,
      threshold,
      darkLevel,
      brightLevel,
      noise: estimateNoise(image, darkMask),
    };
  } finally {
    for (const m of mats) m.delete();
  }
}

/** Median absolute horizontal difference in the bright background, scaled to a standard deviation. */
function estimateNoise(image: FloatImage, darkMask: Uint8Array): number {
  const { width, height, data } = image;
  const diffs: number[] = [];
  const stride = Math.max(1, Math.floor((width * height) / 40000));
  for (let i = 0; i < data.length - 1; i += stride) {
    if (i % width === width - 1 || darkMask[i] || darkMask[i + 1]) continue;
    diffs.push(Math.abs(data[i + 1] - data[i]));
  }
  if (!diffs.length) return 0;
  diffs.sort((a, b) => a - b);
  return (1.4826 * diffs[diffs.length >> 1]) / Math.SQRT2;
}

/**
 * Automatic baseline: in every column the first darkening edge from the top is the substrate
 * surface where no drop or needle is in the way. A line is fitted to those points by RANSAC that
 * prefers lines with nothing below them (the drop lies above the substrate), then refined by least
 * squares. Works for tilted substrates (up to ~20°) and for reflective ones whose surface shows as
 * a step from backlight to a grey mirror image.
 */
export function detectBaseline(maps: EdgeMaps, image: FloatImage): Baseline | null {
  const { width, height, blurred, edges } = maps;
  const contrast = maps.brightLevel - maps.darkLevel;
  const xs: number[] = [];
  const ys: number[] = [];
  const stride = Math.max(1, Math.floor(width / 1200));
  for (let x = 2; x < width - 2; x += stride) {
    for (let y = 3; y < height - 3; y++) {
      const i = y * width + x;
      if (!edges[i]) continue;
      if (blurred[i + 3 * width] + 0.12 * contrast >= blurred[i - 3 * width]) continue;
      const crossing = edgeAlongNormal(image, x, y, 0, -1, searchWindow(width, height));
      if (crossing && crossing.rise > 0.12 * contrast && Math.abs(crossing.offset) < 3) {
        xs.push(x);
        ys.push(y - crossing.offset);
      }
      break;
    }
  }
  const n = xs.length;
  const minInliers = Math.max(12, Math.floor(0.06 * (width / stride)));
  if (n < minInliers) return null;
  const random = seededRandomForAnalysis(12345);
  const maxSlope = Math.tan((20 * Math.PI) / 180);
  let bestScore = -Infinity;
  let best: [number, number] | null = null;
  for (let trial = 0; trial < 300; trial++) {
    const i = Math.floor(random() * n);
    const j = Math.floor(random() * n);
    if (Math.abs(xs[i] - xs[j]) < width / 20) continue;
    const slope = (ys[j] - ys[i]) / (xs[j] - xs[i]);
    if (Math.abs(slope) > maxSlope) continue;
    const intercept = ys[i] - slope * xs[i];
    let inliers = 0;
    let below = 0;
    for (let k = 0; k < n; k++) {
      const r = ys[k] - (intercept + slope * xs[k]);
      if (Math.abs(r) < 1) inliers++;
      else if (r > 3) below++;
    }
    const score = inliers - 3 * below;
    if (score > bestScore) {
      bestScore = score;
      best = [intercept, slope];
    }
  }
  if (!best) return null;
  let [a, b] = best;
  let used = 0;
  for (let pass = 0; pass < 3; pass++) {
    let sx = 0;
    let sy = 0;
    let sxx = 0;
    let sxy = 0;
    used = 0;
    const tolerance = pass === 0 ? 1.5 : 1;
    for (let k = 0; k < n; k++) {
      if (Math.abs(ys[k] - (a + b * xs[k])) > tolerance) continue;
      sx += xs[k];
      sy += ys[k];
      sxx += xs[k] * xs[k];
      sxy += xs[k] * ys[k];
      used++;
    }
    if (used < minInliers) return null;
    const det = used * sxx - sx * sx;
    if (det <= 0) return null;
    b = (used * sxy - sx * sy) / det;
    a = (sy - b * sx) / used;
  }
  return { x1: 0, y1: a, x2: width - 1, y2: a + b * (width - 1) };
}

export interface ProfileExtraction {
  /** Sub-pixel edge points, image pixels, in contour order. */
  points: Point[];
  needleInContact: boolean;
  touchesBorder: boolean;
  /** Median blur width (σ, px) of the edge profiles. */
  edgeSpread: number;
  /** Pixel contour size before refinement. */
  contourLength: number;
}

/**
 * The drop silhouette above the baseline: largest dark region resting on the baseline (holes such as
 * a lens spot are ignored by taking the outer contour), minus a needle entering from the top edge.
 */
export function extractProfile(
  cv: OpenCv,
  maps: EdgeMaps,
  image: FloatImage,
  frame: BaselineFrame,
): ProfileExtraction | null {
  const { width, height, darkMask } = maps;
  const cut = 2;
  const cutMask = new Uint8Array(darkMask.length);
  const [evx, evy] = frame.ev;
  for (let y = 0; y < height; y++) {
    // v = (x − ox)·evx + (y − oy)·evy, linear along the row.
    const rowV = (y - frame.oy) * evy - frame.ox * evx;
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      if (darkMask[i] && rowV + x * evx >= cut) cutMask[i] = 255;
    }
  }
  const contour = largestRestingContour(cv, cutMask, width, height, frame, cut);
  if (!contour) return null;
  const m = contour.length / 2;
  const px = new Float64Array(m);
  const py = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    px[k] = contour[2 * k];
    py[k] = contour[2 * k + 1];
  }

  let needleLeft = Infinity;
  let needleRight = -Infinity;
  let minX = Infinity;
  let maxX = -Infinity;
  for (let k = 0; k < m; k++) {
    minX = Math.min(minX, px[k]);
    maxX = Math.max(maxX, px[k]);
    if (py[k] <= 1) {
      needleLeft = Math.min(needleLeft, px[k]);
      needleRight = Math.max(needleRight, px[k]);
    }
  }
  let needleInContact = false;
  let touchesBorder = false;
  if (needleRight >= needleLeft) {
    if (needleRight - needleLeft < 0.35 * (maxX - minX)) needleInContact = true;
    else touchesBorder = true;
  }
  const window = searchWindow(width, height);
  const pad = needleInContact ? Math.max(3, 0.3 * (needleRight - needleLeft)) : 0;

  const contrast = maps.brightLevel - maps.darkLevel;
  const points: Point[] = [];
  const spreads: number[] = [];
  const valid = new Uint8Array(m);
  const rx = new Float64Array(m);
  const ry = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const x = px[k];
    const y = py[k];
    if (needleInContact && x >= needleLeft - pad && x <= needleRight + pad) continue;
    if (x <= 0 || x >= width - 1 || y <= 0 || y >= height - 1) {
      touchesBorder = true;
      continue;
    }
    if (frame.toFrame(x, y)[1] < cut + 0.5) continue;
    const a = (k - 3 + m) % m;
    const b = (k + 3) % m;
    let tx = px[b] - px[a];
    let ty = py[b] - py[a];
    const tl = Math.hypot(tx, ty) || 1;
    tx /= tl;
    ty /= tl;
    let nx = ty;
    let ny = -tx;
    // Point the normal from the dark silhouette to the bright backlight.
    const ahead =
      maps.blurred[
        Math.round(clamp(y + 2 * ny, 0, height - 1)) * width +
          Math.round(clamp(x + 2 * nx, 0, width - 1))
      ];
    const behind =
      maps.blurred[
        Math.round(clamp(y - 2 * ny, 0, height - 1)) * width +
          Math.round(clamp(x - 2 * nx, 0, width - 1))
      ];
    if (ahead < behind) {
      nx = -nx;
      ny = -ny;
    }
    const crossing = edgeAlongNormal(image, x, y, nx, ny, window);
    if (!crossing || crossing.rise < 0.35 * contrast || Math.abs(crossing.offset) > 3) continue;
    valid[k] = 1;
    rx[k] = x + crossing.offset * nx;
    ry[k] = y + crossing.offset * ny;
    spreads.push(crossing.spread);
  }
  // Outliers: a point far from the chord of its neighbours two steps away on either side.
  for (let k = 0; k < m; k++) {
    if (!valid[k]) continue;
    const a = (k - 2 + m) % m;
    const b = (k + 2) % m;
    if (!valid[a] || !valid[b]) {
      points.push([rx[k], ry[k]]);
      continue;
    }
    const cx = rx[b] - rx[a];
    const cy = ry[b] - ry[a];
    const cl = Math.hypot(cx, cy);
    const dist = cl > 0 ? Math.abs((rx[k] - rx[a]) * cy - (ry[k] - ry[a]) * cx) / cl : 0;
    if (dist <= 0.75) points.push([rx[k], ry[k]]);
  }
  spreads.sort((p, q) => p - q);
  return {
    points,
    needleInContact,
    touchesBorder,
    edgeSpread: spreads.length ? spreads[spreads.length >> 1] : 1,
    contourLength: m,
  };
}

function clamp(value: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, value));
}

/** Outer contour (flat x,y pairs) of the largest dark region whose bottom rests on the cut line. */
function largestRestingContour(
  cv: OpenCv,
  mask: Uint8Array,
  width: number,
  height: number,
  frame: BaselineFrame,
  cut: number,
): Int32Array | null {
  const mat = new cv.Mat(height, width, cv.CV_8UC1);
  const contours = new cv.MatVector();
  const hierarchy = new cv.Mat();
  try {
    mat.data.set(mask);
    cv.findContours(mat, contours, hierarchy, cv.RETR_EXTERNAL, cv.CHAIN_APPROX_NONE);
    let best: Int32Array | null = null;
    let bestArea = 0;
    for (let c = 0; c < contours.size(); c++) {
      const contour = contours.get(c);
      try {
        const area = cv.contourArea(contour, false);
        if (area <= bestArea || area < 50) continue;
        const data = contour.data32S;
        let lowest = Infinity;
        for (let k = 0; k < data.length; k += 2)
          lowest = Math.min(lowest, frame.toFrame(data[k], data[k + 1])[1]);
        if (lowest > cut + 2) continue;
        best = data.slice();
        bestArea = area;
      } finally {
        contour.delete();
      }
    }
    return best;
  } finally {
    mat.delete();
    contours.delete();
    hierarchy.delete();
  }
}

/**
 * Fallback baseline for a mirror-like substrate whose surface does not show: drop and reflection
 * form one dark shape that is mirror-symmetric about the baseline, meeting at a neck (θ > 90°) or
 * a corner (θ < 90°). On each side the row about which the outline is most symmetric is the contact
 * row; the baseline joins the two contact points.
 */
export function detectMirrorBaseline(
  cv: OpenCv,
  maps: EdgeMaps,
  image: FloatImage,
): Baseline | null {
  const { width, height } = maps;
  const contour = largestContour(cv, maps.darkMask, width, height);
  if (!contour) return null;
  let top = Infinity;
  let bottom = -Infinity;
  for (let k = 1; k < contour.length; k += 2) {
    top = Math.min(top, contour[k]);
    bottom = Math.max(bottom, contour[k]);
  }
  if (bottom - top < 20 || top <= 0 || bottom >= height - 1) return null;
  const rows = bottom - top + 1;
  const left = new Float64Array(rows).fill(Infinity);
  const right = new Float64Array(rows).fill(-Infinity);
  for (let k = 0; k < contour.length; k += 2) {
    const r = contour[k + 1] - top;
    left[r] = Math.min(left[r], contour[k]);
    right[r] = Math.max(right[r], contour[k]);
  }
  const window = searchWindow(width, height);
  for (let r = 0; r < rows; r++) {
    const y = r + top;
    const l = edgeAlongNormal(image, left[r], y, -1, 0, window);
    if (l && Math.abs(l.offset) < 3) left[r] -= l.offset;
    const rr = edgeAlongNormal(image, right[r], y, 1, 0, window);
    if (rr && Math.abs(rr.offset) < 3) right[r] += rr.offset;
  }
  const at = (xs: Float64Array, row: number) => {
    const i = Math.floor(row);
    const f = row - i;
    return i + 1 < rows ? xs[i] + f * (xs[i + 1] - xs[i]) : xs[i];
  };
  const mirrorRow = (xs: Float64Array): number | null => {
    let best = Infinity;
    let bestRow = -1;
    for (let c = 5; c < rows - 5; c += 0.25) {
      const reach = Math.floor(Math.min(c, rows - 1 - c)) - 1;
      if (reach < 5) continue;
      let sum = 0;
      for (let k = 1; k <= reach; k++) sum += Math.abs(at(xs, c + k) - at(xs, c - k));
      // Symmetric over the whole reach: the score must not favour short reaches.
      const score = sum / reach + 2 / reach;
      if (score < best) {
        best = score;
        bestRow = c;
      }
    }
    return bestRow >= 0 && best < 1.5 ? bestRow : null;
  };
  const rowLeft = mirrorRow(left);
  const rowRight = mirrorRow(right);
  if (rowLeft === null || rowRight === null) return null;
  return { x1: at(left, rowLeft), y1: rowLeft + top, x2: at(right, rowRight), y2: rowRight + top };
}

function largestContour(
  cv: OpenCv,
  mask: Uint8Array,
  width: number,
  height: number,
): Int32Array | null {
  const mat = new cv.Mat(height, width, cv.CV_8UC1);
  const contours = new cv.MatVector();
  const hierarchy = new cv.Mat();
  try {
    mat.data.set(mask);
    cv.findContours(mat, contours, hierarchy, cv.RETR_EXTERNAL, cv.CHAIN_APPROX_NONE);
    let best: Int32Array | null = null;
    let bestArea = 0;
    for (let c = 0; c < contours.size(); c++) {
      const contour = contours.get(c);
      try {
        const area = cv.contourArea(contour, false);
        if (area > bestArea) {
          bestArea = area;
          best = contour.data32S.slice();
        }
      } finally {
        contour.delete();
      }
    }
    return best;
  } finally {
    mat.delete();
    contours.delete();
    hierarchy.delete();
  }
}
