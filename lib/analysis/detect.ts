/**
 * From pixels to what the fits need, in two parts:
 *
 * - `computeEdgeMaps` (once per photo): denoise, Otsu split of dark silhouette and bright backlight,
 *   contrast and noise, and the outer contours of every dark region (drop, substrate, needle,
 *   reflection together). Nothing here depends on the baseline.
 * - `detectBaseline` / `detectMirrorBaseline`: the automatic baseline from the substrate surface
 *   (or from the drop–reflection neck on a mirror).
 *
 * The profile for a given baseline is cut from those contours by `DropOutline` (outline.ts), so a
 * new baseline or method re-uses the detected edges.
 */
import type { OpenCv, CvMat, CvMatVector } from './opencv';
import { toUint8, type PixelImage } from './image';
import { edgeAlongNormal } from './subpixel';
import { seededRandomForAnalysis } from './random';
import { denoiseSigma, edgeSearchHalfWidth, type AnalysisSettings } from './settings';
import type { Baseline } from './types';

export interface EdgeMaps {
  width: number;
  height: number;
  /** The denoised 8-bit image. */
  blurred: Uint8Array;
  /** Otsu threshold on `blurred`: a pixel at or below it is dark (silhouette, substrate). */
  threshold: number;
  darkLevel: number;
  brightLevel: number;
  /** Robust noise estimate of the background (0–255 scale). */
  noise: number;
  /** Outer contours of the dark regions (flat x, y pairs), at least `minRegionAreaPx2` each. */
  contours: Int32Array[];
  /** Their areas (px²), in the same order. */
  contourAreas: number[];
}

/**
 * OpenCV part: Gaussian denoise, Otsu threshold, outer contours of the dark regions. Every Mat is
 * deleted before returning. (No Canny: the substrate search below and the sub-pixel refinement
 * read the intensity profile themselves, and a Canny pass would cost as much as all the rest.)
 */
export function computeEdgeMaps(
  cv: OpenCv,
  image: PixelImage,
  settings: AnalysisSettings,
): EdgeMaps {
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
    const sigma = denoiseSigma(settings, width, height);
    // A kernel of ±2σ: the tails beyond it weigh 5 % and change no edge position.
    const size = 2 * Math.max(1, Math.round(2 * sigma)) + 1;
    cv.GaussianBlur(src, blur, new cv.Size(size, size), sigma, sigma, cv.BORDER_DEFAULT);
    const mask = track(new cv.Mat());
    const threshold = cv.threshold(blur, mask, 0, 255, cv.THRESH_BINARY_INV + cv.THRESH_OTSU);
    const blurred = blur.data.slice();
    // Class means from every third pixel: plenty for two averages, a third of the work.
    let darkSum = 0;
    let darkCount = 0;
    let brightSum = 0;
    let brightCount = 0;
    for (let i = 0; i < blurred.length; i += 3) {
      const level = blurred[i];
      if (level <= threshold) {
        darkSum += level;
        darkCount++;
      } else {
        brightSum += level;
        brightCount++;
      }
    }
    const contours = track(new cv.MatVector());
    const hierarchy = track(new cv.Mat());
    cv.findContours(mask, contours, hierarchy, cv.RETR_EXTERNAL, cv.CHAIN_APPROX_NONE);
    const kept: Int32Array[] = [];
    const areas: number[] = [];
    for (let c = 0; c < contours.size(); c++) {
      const contour = contours.get(c);
      try {
        const area = cv.contourArea(contour, false);
        if (area < settings.minRegionAreaPx2) continue;
        kept.push(contour.data32S.slice());
        areas.push(area);
      } finally {
        contour.delete();
      }
    }
    return {
      width,
      height,
      blurred,
      threshold,
      darkLevel: darkCount ? darkSum / darkCount : 0,
      brightLevel: brightCount ? brightSum / brightCount : 255,
      noise: estimateNoise(image, blurred, threshold),
      contours: kept,
      contourAreas: areas,
    };
  } finally {
    for (const m of mats) m.delete();
  }
}

/**
 * Median absolute horizontal difference in the bright background, scaled to a standard deviation
 * (for Gaussian noise the difference of two samples has σ√2, its median absolute value 0.6745 σ√2).
 * The median comes from a histogram with 1/16-level bins.
 */
function estimateNoise(image: PixelImage, blurred: Uint8Array, threshold: number): number {
  const { width, height, scale } = image;
  const bins = 16;
  const histogram = new Uint32Array(64 * bins);
  const last = histogram.length - 1;
  // About 40 000 pairs on a grid of rows and columns.
  const step = Math.max(1, Math.round(Math.sqrt((width * height) / 40000)));
  const factor = scale * bins;
  const data = image.data;
  let count = 0;
  for (let y = 0; y < height; y += step) {
    const row = y * width;
    for (let x = 0; x < width - 1; x += step) {
      const i = row + x;
      if (blurred[i] <= threshold || blurred[i + 1] <= threshold) continue;
      const bin = Math.floor(Math.abs(data[i + 1] - data[i]) * factor);
      histogram[bin > last ? last : bin]++;
      count++;
    }
  }
  if (!count) return 0;
  let seen = 0;
  for (let b = 0; b < histogram.length; b++) {
    seen += histogram[b];
    if (seen * 2 > count) {
      // Linear interpolation inside the bin holding the median.
      const within = (count / 2 - (seen - histogram[b])) / histogram[b];
      return (1.4826 * ((b + within) / bins)) / Math.SQRT2;
    }
  }
  return 0;
}

/**
 * Automatic baseline: in every column the first darkening step from the top is the substrate
 * surface where no drop or needle is in the way. The step is where the vertical difference of the
 * denoised image peaks (as a Canny edge would), refined to sub-pixel
 * precision along the column. A line is fitted to those points by RANSAC that prefers lines with
 * nothing below them (the drop lies above the substrate), then refined by least squares. Works for
 * tilted substrates (up to `baselineMaxTiltDeg`) and for reflective ones whose surface shows as a
 * step from backlight to a grey mirror image.
 */
export function detectBaseline(
  maps: EdgeMaps,
  image: PixelImage,
  settings: AnalysisSettings,
): Baseline | null {
  const { width, height, blurred } = maps;
  const contrast = maps.brightLevel - maps.darkLevel;
  const stepMin = settings.substrateStepShare * contrast;
  // Canny's thresholds (0.15 and 0.3 × contrast on the Sobel magnitude, 8× the slope per pixel)
  // correspond to a two-row difference of 0.04–0.08 × contrast; noise that passes is caught by
  // the step test below.
  const peakMin = 0.05 * contrast;
  const window = edgeSearchHalfWidth(settings, width, height);
  const xs: number[] = [];
  const ys: number[] = [];
  const stride = Math.max(1, Math.floor(width / 1200));
  for (let x = 2; x < width - 2; x += stride) {
    for (let y = 3; y < height - 3; y++) {
      const i = y * width + x;
      const g = blurred[i - width] - blurred[i + width];
      if (g < peakMin) continue;
      // The peak of the step: the difference one row further down is not larger.
      if (blurred[i] - blurred[i + 2 * width] > g) continue;
      if (blurred[i + 3 * width] + stepMin >= blurred[i - 3 * width]) continue;
      const crossing = edgeAlongNormal(image, x, y, 0, -1, window);
      if (crossing && crossing.rise > stepMin && Math.abs(crossing.offset) < 3) {
        xs.push(x);
        ys.push(y - crossing.offset);
      }
      break;
    }
  }
  const n = xs.length;
  const minInliers = Math.max(12, Math.floor(settings.baselineMinColumnShare * (width / stride)));
  if (n < minInliers) return null;
  const random = seededRandomForAnalysis(settings.baselineSeed);
  const maxSlope = Math.tan((settings.baselineMaxTiltDeg * Math.PI) / 180);
  const inlier = settings.baselineInlierPx;
  let bestScore = -Infinity;
  let best: [number, number] | null = null;
  for (let trial = 0; trial < settings.baselineRansacTrials; trial++) {
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
      if (Math.abs(r) < inlier) inliers++;
      else if (r > 3 * inlier) below++;
    }
    const score = inliers - 3 * below;
    if (score > bestScore) {
      bestScore = score;
      best = [intercept, slope];
    }
  }
  if (!best) return null;
  let [a, b] = best;
  for (let pass = 0; pass < 3; pass++) {
    let sx = 0;
    let sy = 0;
    let sxx = 0;
    let sxy = 0;
    let used = 0;
    const tolerance = pass === 0 ? 1.5 * inlier : inlier;
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

/**
 * Fallback baseline for a mirror-like substrate whose surface does not show: drop and reflection
 * form one dark shape that is mirror-symmetric about the baseline, meeting at a neck (θ > 90°) or
 * a corner (θ < 90°). On each side the row about which the outline is most symmetric is the contact
 * row; the baseline joins the two contact points.
 */
export function detectMirrorBaseline(
  maps: EdgeMaps,
  image: PixelImage,
  settings: AnalysisSettings,
): Baseline | null {
  const { width, height } = maps;
  let contour: Int32Array | null = null;
  let bestArea = 0;
  maps.contours.forEach((c, k) => {
    if (maps.contourAreas[k] > bestArea) {
      bestArea = maps.contourAreas[k];
      contour = c;
    }
  });
  if (!contour) return null;
  const points: Int32Array = contour;
  let top = Infinity;
  let bottom = -Infinity;
  for (let k = 1; k < points.length; k += 2) {
    top = Math.min(top, points[k]);
    bottom = Math.max(bottom, points[k]);
  }
  if (bottom - top < 20 || top <= 0 || bottom >= height - 1) return null;
  const rows = bottom - top + 1;
  const left = new Float64Array(rows).fill(Infinity);
  const right = new Float64Array(rows).fill(-Infinity);
  for (let k = 0; k < points.length; k += 2) {
    const r = points[k + 1] - top;
    left[r] = Math.min(left[r], points[k]);
    right[r] = Math.max(right[r], points[k]);
  }
  const window = edgeSearchHalfWidth(settings, width, height);
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
