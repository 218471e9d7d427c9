/**
 * The drop's outline for a given baseline, cut from the contours found once per photo.
 *
 * The dark regions' outer contours (edge maps) hold the drop together with the substrate, the
 * needle and any reflection. For a baseline, each contour is split into runs of points lying more
 * than `cutAboveBaselinePx` above it; the run enclosing the largest area that rests on the cut is
 * the drop (a needle or speck that does not reach the cut is not). A run reaching the top border in
 * a narrow strip carries a needle in contact, which is left out. Each contour pixel is refined to
 * the sub-pixel edge along its normal once, on first use, and kept: a later baseline (a drag) or
 * method re-uses the refined points.
 */
import type { EdgeMaps } from './detect';
import type { BaselineFrame } from './frame';
import type { PixelImage } from './image';
import { edgeSearchHalfWidth, type AnalysisSettings } from './settings';
import { edgeAlongNormal } from './subpixel';
import type { Point } from './types';

export interface ProfileExtraction {
  /** Sub-pixel edge points, image pixels, in contour order. */
  points: Point[];
  needleInContact: boolean;
  touchesBorder: boolean;
  /** Median blur width (σ, px) of the edge profiles. */
  edgeSpread: number;
  /** Where the run was cut from: contour index and the run's first index and length. */
  run: { contour: number; start: number; length: number };
}

const UNKNOWN = 0;
const VALID = 1;
const REJECTED = 2;

interface Refined {
  state: Uint8Array;
  x: Float64Array;
  y: Float64Array;
  spread: Float32Array;
}

export class DropOutline {
  private readonly refined: Refined[];
  private readonly window: number;
  private readonly contrast: number;

  constructor(
    readonly maps: EdgeMaps,
    private readonly image: PixelImage,
    private readonly settings: AnalysisSettings,
  ) {
    this.refined = maps.contours.map((c) => {
      const m = c.length / 2;
      return {
        state: new Uint8Array(m),
        x: new Float64Array(m),
        y: new Float64Array(m),
        spread: new Float32Array(m),
      };
    });
    this.window = edgeSearchHalfWidth(settings, maps.width, maps.height);
    this.contrast = maps.brightLevel - maps.darkLevel;
  }

  /**
   * The drop's run for this baseline, refined to sub-pixel points; null if nothing rests on it.
   * With `substrate` (the substrate line found in the photo, when the baseline was given by hand),
   * contour points within the cut of that line are left out: they are the substrate's own edge,
   * which a baseline dragged below the surface would otherwise take for part of the drop.
   */
  profileFor(frame: BaselineFrame, substrate?: BaselineFrame): ProfileExtraction | null {
    const run = this.findRun(frame);
    if (!run) return null;
    const { width, height } = this.maps;
    const contour = this.maps.contours[run.contour];
    const m = contour.length / 2;
    const cut = this.settings.cutAboveBaselinePx;

    let needleLeft = Infinity;
    let needleRight = -Infinity;
    let minX = Infinity;
    let maxX = -Infinity;
    for (let j = 0; j < run.length; j++) {
      const k = (run.start + j) % m;
      const x = contour[2 * k];
      minX = Math.min(minX, x);
      maxX = Math.max(maxX, x);
      if (contour[2 * k + 1] <= 1) {
        needleLeft = Math.min(needleLeft, x);
        needleRight = Math.max(needleRight, x);
      }
    }
    let needleInContact = false;
    let touchesBorder = false;
    if (needleRight >= needleLeft) {
      if (needleRight - needleLeft < this.settings.needleMaxWidthShare * (maxX - minX))
        needleInContact = true;
      else touchesBorder = true;
    }
    const pad = needleInContact ? Math.max(3, 0.3 * (needleRight - needleLeft)) : 0;

    // Usable (refined, kept) points of the run, by position in the run.
    const usable = new Uint8Array(run.length);
    for (let j = 0; j < run.length; j++) {
      const k = (run.start + j) % m;
      const x = contour[2 * k];
      const y = contour[2 * k + 1];
      if (needleInContact && x >= needleLeft - pad && x <= needleRight + pad) continue;
      const onBorder = x <= 0 || x >= width - 1 || y <= 0 || y >= height - 1;
      if (substrate) {
        // The substrate's own edge: along its line, or down the image border below it.
        const vs = substrate.toFrameV(x, y);
        if (Math.abs(vs) < cut || (onBorder && vs < 0)) continue;
      }
      if (onBorder) {
        touchesBorder = true;
        continue;
      }
      if (frame.toFrameV(x, y) < cut + 0.5) continue;
      if (this.refine(run.contour, k) === VALID) usable[j] = 1;
    }
    const refined = this.refined[run.contour];
    const points: Point[] = [];
    const spreads: number[] = [];
    const limit = this.settings.outlierChordPx;
    // Outliers: a point far from the chord of its neighbours two steps away on either side.
    for (let j = 0; j < run.length; j++) {
      if (!usable[j]) continue;
      const k = (run.start + j) % m;
      const x = refined.x[k];
      const y = refined.y[k];
      spreads.push(refined.spread[k]);
      if (j < 2 || j + 2 >= run.length || !usable[j - 2] || !usable[j + 2]) {
        points.push([x, y]);
        continue;
      }
      const a = (k - 2 + m) % m;
      const b = (k + 2) % m;
      const cx = refined.x[b] - refined.x[a];
      const cy = refined.y[b] - refined.y[a];
      const cl = Math.hypot(cx, cy);
      const dist =
        cl > 0 ? Math.abs((x - refined.x[a]) * cy - (y - refined.y[a]) * cx) / cl : 0;
      if (dist <= limit) points.push([x, y]);
    }
    spreads.sort((p, q) => p - q);
    if (points.length === 0) return null;
    return {
      points,
      needleInContact,
      touchesBorder,
      edgeSpread: spreads.length ? spreads[spreads.length >> 1] : 1,
      run,
    };
  }

  /**
   * Where the drop's outline meets this line (the substrate line), left and right, in image pixels:
   * the refined points of the run's two ends that lie within a few pixels above the cut, each end
   * extrapolated straight down to the line. Null when the run or its ends are missing.
   */
  contactsOn(frame: BaselineFrame): { left: [number, number]; right: [number, number] } | null {
    const run = this.findRun(frame);
    if (!run) return null;
    const contour = this.maps.contours[run.contour];
    const m = contour.length / 2;
    const memo = this.refined[run.contour];
    const cut = this.settings.cutAboveBaselinePx;
    const ends: Array<[number, number]> = [];
    for (const direction of [1, -1]) {
      // Points from this end of the run upward, up to 6 px above the cut.
      let su = 0;
      let sv = 0;
      let suv = 0;
      let svv = 0;
      let count = 0;
      for (let j = 0; j < run.length; j++) {
        const k = (run.start + (direction > 0 ? j : run.length - 1 - j)) % m;
        const cx = contour[2 * k];
        const cy = contour[2 * k + 1];
        const v = frame.toFrameV(cx, cy);
        if (v > cut + 6) break;
        if (this.refine(run.contour, k) !== VALID) continue;
        const [ru, rv] = frame.toFrame(memo.x[k], memo.y[k]);
        su += ru;
        sv += rv;
        suv += ru * rv;
        svv += rv * rv;
        count++;
      }
      if (count < 2) return null;
      const det = count * svv - sv * sv;
      // u = a + c v through the end's points, read at v = 0 (straight down if they are level).
      const c = Math.abs(det) > 1e-9 ? (count * suv - su * sv) / det : 0;
      const a = (su - c * sv) / count;
      ends.push(frame.toImage(a, 0));
    }
    const [first, last] = ends;
    return frame.toFrame(first[0], first[1])[0] < frame.toFrame(last[0], last[1])[0]
      ? { left: first, right: last }
      : { left: last, right: first };
  }

  /**
   * The run (consecutive contour points more than the cut above the baseline) enclosing the
   * largest area and resting on the cut; a contour wholly above the cut counts when its lowest
   * point is within 2 px of it.
   */
  private findRun(frame: BaselineFrame): ProfileExtraction['run'] | null {
    const cut = this.settings.cutAboveBaselinePx;
    let best: ProfileExtraction['run'] | null = null;
    let bestArea = this.settings.minRegionAreaPx2;
    this.maps.contours.forEach((contour, c) => {
      const m = contour.length / 2;
      const v = new Float64Array(m);
      let firstBelow = -1;
      let lowest = Infinity;
      for (let k = 0; k < m; k++) {
        v[k] = frame.toFrameV(contour[2 * k], contour[2 * k + 1]);
        lowest = Math.min(lowest, v[k]);
        if (firstBelow < 0 && v[k] < cut) firstBelow = k;
      }
      const consider = (start: number, length: number) => {
        const area = runArea(contour, start, length);
        if (area > bestArea) {
          bestArea = area;
          best = { contour: c, start, length };
        }
      };
      if (firstBelow < 0) {
        if (lowest <= cut + 2) consider(0, m);
        return;
      }
      let start = -1;
      for (let j = 1; j <= m; j++) {
        const k = (firstBelow + j) % m;
        const above = v[k] >= cut;
        if (above && start < 0) start = j;
        if ((!above || j === m) && start >= 0) {
          const length = (above ? j + 1 : j) - start;
          if (length >= 3) consider((firstBelow + start) % m, length);
          start = -1;
        }
      }
    });
    return best;
  }

  /** Refines contour point k of contour c along its normal (once); returns its state. */
  private refine(c: number, k: number): number {
    const memo = this.refined[c];
    if (memo.state[k] !== UNKNOWN) return memo.state[k];
    const contour = this.maps.contours[c];
    const m = contour.length / 2;
    const { width, height, blurred } = this.maps;
    const x = contour[2 * k];
    const y = contour[2 * k + 1];
    const a = (k - 3 + m) % m;
    const b = (k + 3) % m;
    let tx = contour[2 * b] - contour[2 * a];
    let ty = contour[2 * b + 1] - contour[2 * a + 1];
    const tl = Math.hypot(tx, ty) || 1;
    tx /= tl;
    ty /= tl;
    let nx = ty;
    let ny = -tx;
    // Point the normal from the dark silhouette to the bright backlight.
    const ahead =
      blurred[
        Math.round(clamp(y + 2 * ny, 0, height - 1)) * width +
          Math.round(clamp(x + 2 * nx, 0, width - 1))
      ];
    const behind =
      blurred[
        Math.round(clamp(y - 2 * ny, 0, height - 1)) * width +
          Math.round(clamp(x - 2 * nx, 0, width - 1))
      ];
    if (ahead < behind) {
      nx = -nx;
      ny = -ny;
    }
    const crossing = edgeAlongNormal(this.image, x, y, nx, ny, this.window);
    if (
      !crossing ||
      crossing.rise < this.settings.edgeMinRiseShare * this.contrast ||
      Math.abs(crossing.offset) > this.settings.edgeMaxShiftPx
    ) {
      memo.state[k] = REJECTED;
      return REJECTED;
    }
    memo.x[k] = x + crossing.offset * nx;
    memo.y[k] = y + crossing.offset * ny;
    memo.spread[k] = crossing.spread;
    memo.state[k] = VALID;
    return VALID;
  }
}

/** Area enclosed by a run of contour points and the chord closing it (shoelace). */
function runArea(contour: Int32Array, start: number, length: number): number {
  const m = contour.length / 2;
  let twice = 0;
  let px = contour[2 * ((start + length - 1) % m)];
  let py = contour[2 * ((start + length - 1) % m) + 1];
  for (let j = 0; j < length; j++) {
    const k = (start + j) % m;
    const x = contour[2 * k];
    const y = contour[2 * k + 1];
    twice += px * y - x * py;
    px = x;
    py = y;
  }
  return Math.abs(twice) / 2;
}

function clamp(value: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, value));
}
