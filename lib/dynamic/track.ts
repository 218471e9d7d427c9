/**
 * Frame-to-frame tracking of one drop: each frame is analysed with the engine's public API
 * (`analyseDropWith`) inside a region of interest around the previous outline, with the previous
 * baseline kept while the substrate edge still lies on it. Whenever the region or the kept
 * baseline does not hold (drop cut by the region, no drop found), the frame is analysed again on
 * the whole image with the baseline found afresh; a frame that still fails is returned with its
 * error as a warning and null values, never dropped. Each frame's fit starts from the previous
 * frame's (warm start, same stopping rules as a cold one; see `FitCarry` in lib/analysis) unless
 * that frame failed or carried warnings.
 */
import {
  AnalysisError,
  DEFAULT_METHOD,
  analyseDropWith,
  type AnalyseOptions,
  type AnalysisResult,
  type Baseline,
  type CarriedFit,
  type FitCarry,
  type GrayImage,
  type OpenCv,
  type RegionOfInterest,
} from '../analysis';
import { isFlagged } from './phases';
import type { FrameTracking, FrameWarning, SeriesFrame, SeriesOptions } from './types';

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/** Room around the last outline: a share of the drop's size, at least a few edge widths. */
export const REGION_MARGIN = {
  /** Beside the contact points (substrate for the baseline, room to spread or slide). */
  sideFraction: 0.15,
  /** Above the apex (room to grow). */
  topFraction: 0.15,
  /** Below the baseline (the substrate edge must be inside). */
  belowPx: 24,
  minPx: 24,
};

/** The region to analyse next: the last outline, its contact points and baseline, with margins. */
export function regionAround(result: AnalysisResult, image: GrayImage): RegionOfInterest {
  let minX = Math.min(result.contactLeft[0], result.contactRight[0]);
  let maxX = Math.max(result.contactLeft[0], result.contactRight[0]);
  let minY = Math.min(result.contactLeft[1], result.contactRight[1]);
  const outline = result.profile ?? [...result.edgePoints.left, ...result.edgePoints.right];
  for (const [x, y] of outline) {
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
  }
  const b = result.baseline;
  const baselineYAt = (x: number) => b.y1 + ((b.y2 - b.y1) * (x - b.x1)) / (b.x2 - b.x1 || 1);
  const bottom = Math.max(baselineYAt(minX), baselineYAt(maxX));
  const width = maxX - minX;
  const height = Math.max(bottom - minY, result.heightPx);
  const side = Math.max(REGION_MARGIN.minPx, REGION_MARGIN.sideFraction * width);
  const top = Math.max(REGION_MARGIN.minPx, REGION_MARGIN.topFraction * height);
  const x0 = Math.max(0, Math.floor(minX - side));
  const y0 = Math.max(0, Math.floor(minY - top));
  const x1 = Math.min(image.width, Math.ceil(maxX + side));
  const y1 = Math.min(image.height, Math.ceil(bottom + REGION_MARGIN.belowPx));
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

/**
 * Whether the substrate edge beside the drop still lies on `baseline`: in a few columns left and
 * right of the contact points (3 columns averaged), the step from backlight to substrate is located
 * at its half-height crossing; the line holds when the median offset is within `tolerancePx`.
 * Reflective substrates whose surface shows no step fail the check, so their baseline is found anew.
 */
export function baselineStillFits(
  image: GrayImage,
  baseline: Baseline,
  contactXs: readonly [number, number],
  within: RegionOfInterest | null,
  tolerancePx = 0.35,
): boolean {
  const { width, height, data } = image;
  const full = data instanceof Uint16Array ? 65535 : 255;
  const lo = (within?.x ?? 0) + 4;
  const hi = (within ? within.x + within.width : width) - 5;
  const [leftContact, rightContact] = [
    Math.min(contactXs[0], contactXs[1]),
    Math.max(contactXs[0], contactXs[1]),
  ];
  const gap = 10;
  const columns: number[] = [];
  const spread = (a: number, b: number) => {
    if (b - a < 6) return 0;
    for (let k = 0; k < 5; k++) columns.push(Math.round(a + ((b - a) * k) / 4));
    return 1;
  };
  const sides = spread(lo, leftContact - gap) + spread(rightContact + gap, hi);
  if (sides === 0) return false;
  const slope = (baseline.y2 - baseline.y1) / (baseline.x2 - baseline.x1 || 1);
  const offsets: number[] = [];
  const profile = new Float64Array(15);
  for (const x of columns) {
    const yb = baseline.y1 + slope * (x - baseline.x1);
    const r0 = Math.floor(yb) - 7;
    if (x < 1 || x > width - 2 || r0 < 0 || r0 + profile.length > height) continue;
    for (let r = 0; r < profile.length; r++) {
      const row = (r0 + r) * width + x;
      profile[r] = (data[row - 1] + data[row] + data[row + 1]) / 3;
    }
    const top = (profile[0] + profile[1] + profile[2]) / 3;
    const bottom = (profile[12] + profile[13] + profile[14]) / 3;
    if (top - bottom < 0.08 * full) continue;
    const mid = (top + bottom) / 2;
    for (let r = 2; r < 12; r++) {
      if (profile[r] >= mid && profile[r + 1] < mid) {
        const y = r0 + r + (profile[r] - mid) / (profile[r] - profile[r + 1]);
        offsets.push(y - yb);
        break;
      }
    }
  }
  if (offsets.length < 4) return false;
  const abs = offsets.map(Math.abs).sort((a, b) => a - b);
  return abs[abs.length >> 1] <= tolerancePx && abs[abs.length - 1] <= 4 * tolerancePx;
}

/** The analysis result touches the region's border where the image goes on: the region was too small. */
function cutByRegion(result: AnalysisResult, roi: RegionOfInterest, image: GrayImage): boolean {
  if (!result.warnings.some((w) => w.code === 'drop_cut_by_border')) {
    const xs = [result.contactLeft[0], result.contactRight[0]];
    const inner = 3;
    return xs.some(
      (x) =>
        (roi.x > 0 && x < roi.x + inner) ||
        (roi.x + roi.width < image.width && x > roi.x + roi.width - inner),
    );
  }
  return (
    roi.x > 0 || roi.y > 0 || roi.x + roi.width < image.width || roi.y + roi.height < image.height
  );
}

function failure(error: unknown): FrameWarning {
  if (error instanceof AnalysisError) return { code: error.code, message: error.message };
  return {
    code: 'analysis_failed',
    message: `The frame could not be analysed: ${error instanceof Error ? error.message : String(error)}`,
  };
}

/** Analyses the frames of one series in order, carrying the region and baseline from frame to frame. */
export class SeriesTracker {
  private roi: RegionOfInterest | null = null;
  private baseline: Baseline | null = null;
  private contactXs: [number, number] | null = null;
  private size: [number, number] | null = null;
  /** The last frame's fit, to start the next one from (null: start cold). */
  private carried: CarriedFit | null = null;

  constructor(
    private readonly cv: OpenCv,
    private readonly options: SeriesOptions = {},
  ) {}

  /** Forget the region, baseline and fit (e.g. after a cut in the video). */
  reset(): void {
    this.carried = null;
    this.roi = null;
    this.baseline = null;
    this.contactXs = null;
  }

  analyse(image: GrayImage, index: number, tSec: number): SeriesFrame {
    const started = now();
    if (!this.size || this.size[0] !== image.width || this.size[1] !== image.height) {
      this.reset();
      this.size = [image.width, image.height];
    }
    const given = this.options.baseline;
    const roi = this.options.trackRegion === false ? null : this.roi;
    let kept: Baseline | undefined;
    if (
      !given &&
      this.options.keepBaseline !== false &&
      this.baseline &&
      this.contactXs &&
      baselineStillFits(image, this.baseline, this.contactXs, roi)
    )
      kept = this.baseline;
    const base: AnalyseOptions = {
      method: this.options.method ?? DEFAULT_METHOD,
      scalePxPerMm: this.options.scalePxPerMm,
    };
    const tracking: FrameTracking = {
      roi,
      baseline: given ? 'given' : kept ? 'kept' : 'found',
      retried: false,
      warmStart: false,
    };
    const from = this.options.warmStart === false ? null : this.carried;
    // A fresh carry per attempt, so a discarded attempt's fit never seeds the retry.
    let carry: FitCarry = { from };
    let result: AnalysisResult | null = null;
    let error: unknown = null;
    try {
      result = analyseDropWith(
        this.cv,
        image,
        { ...base, roi: roi ?? undefined, baseline: given ?? kept },
        carry,
      );
      if (roi && cutByRegion(result, roi, image)) result = null;
    } catch (caught) {
      error = caught;
    }
    if (!result && (roi || kept)) {
      // Second chance on the whole frame, baseline found anew (or the caller's).
      tracking.retried = true;
      tracking.roi = null;
      tracking.baseline = given ? 'given' : 'found';
      carry = { from };
      try {
        result = analyseDropWith(this.cv, image, { ...base, baseline: given }, carry);
        error = null;
      } catch (caught) {
        error = caught;
      }
    }
    if (!result) {
      this.carried = null;
      return {
        index,
        tSec,
        leftDeg: null,
        rightDeg: null,
        meanDeg: null,
        baseDiameterPx: null,
        heightPx: null,
        volumePx3: null,
        contactLeft: null,
        contactRight: null,
        baseline: null,
        warnings: [failure(error)],
        tracking,
        analysis: null,
        timeMs: now() - started,
      };
    }
    tracking.warmStart = carry.warm === true;
    // After a flagged frame (the series' one rule, whatever its kind) the next fit starts cold.
    this.carried = isFlagged(result) ? null : (carry.fit ?? null);
    this.baseline = result.baseline;
    this.contactXs = [result.contactLeft[0], result.contactRight[0]];
    this.roi = regionAround(result, image);
    return {
      index,
      tSec,
      leftDeg: result.leftDeg,
      rightDeg: result.rightDeg,
      meanDeg: result.meanDeg,
      baseDiameterPx: result.baseDiameterPx,
      heightPx: result.heightPx,
      volumePx3: result.volumePx3,
      contactLeft: result.contactLeft,
      contactRight: result.contactRight,
      baseline: result.baseline,
      warnings: result.warnings.map((w) => ({ code: w.code, message: w.message })),
      tracking,
      analysis: result,
      timeMs: now() - started,
    };
  }
}
