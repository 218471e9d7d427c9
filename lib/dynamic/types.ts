/**
 * Public types of the dynamic-wetting core: a series of frames of one drop (a video, frame images
 * with a frame rate, or a live camera), analysed frame by frame with lib/analysis. Plain data, so
 * results cross a worker boundary unchanged.
 */
import type {
  AnalysisErrorCode,
  AnalysisResult,
  Baseline,
  FitMethod,
  GrayImage,
  Point,
  RegionOfInterest,
  WarningCode,
} from '../analysis/types';

/** One frame to analyse: its pixels and its time from the start of the series (s). */
export interface SeriesInputFrame {
  image: GrayImage;
  tSec: number;
}

/**
 * Why a frame needs a look: the engine's warnings and error codes, plus `analysis_failed` for
 * anything else that stopped a frame. A failed frame keeps its place with null values.
 */
export type FrameWarningCode = WarningCode | AnalysisErrorCode | 'analysis_failed';

export interface FrameWarning {
  code: FrameWarningCode;
  message: string;
}

/** How the tracker found this frame's drop. */
export interface FrameTracking {
  /** The region analysed (null: the whole frame). */
  roi: RegionOfInterest | null;
  /** `found` by the analysis, `kept` from the previous frame after checking it, or `given` by the caller. */
  baseline: 'found' | 'kept' | 'given';
  /** The first attempt (region or kept baseline) did not hold and the frame was analysed again. */
  retried: boolean;
  /**
   * The fit started from the previous frame's fit (same stopping rules as a cold start); false on
   * the first frame, after a failed or flagged frame, for methods whose fit needs no start
   * (circle, ellipse, polynomial) and when the warm-started fit was refitted cold.
   */
  warmStart: boolean;
}

/** The result of one frame; values are null when the frame could not be analysed. */
export interface SeriesFrame {
  /** Position in the input, from 0. */
  index: number;
  tSec: number;
  leftDeg: number | null;
  rightDeg: number | null;
  meanDeg: number | null;
  baseDiameterPx: number | null;
  heightPx: number | null;
  /** Null also when the method gives no volume (polynomial). */
  volumePx3: number | null;
  contactLeft: Point | null;
  contactRight: Point | null;
  baseline: Baseline | null;
  warnings: FrameWarning[];
  tracking: FrameTracking;
  /** The engine's full result (profile, edge points, uncertainty) for overlays; null when failed. */
  analysis: AnalysisResult | null;
  timeMs: number;
}

export interface SeriesOptions {
  method?: FitMethod;
  /** Used for every frame exactly as given (the user's drag); otherwise found and then tracked. */
  baseline?: Baseline;
  /** Analyse a region around the last outline instead of the whole frame (default true). */
  trackRegion?: boolean;
  /** Reuse the previous frame's baseline while the substrate edge still lies on it (default true). */
  keepBaseline?: boolean;
  /** Start each frame's fit from the previous frame's when the method's fit is iterative (default true). */
  warmStart?: boolean;
  scalePxPerMm?: number;
}

/** A span of time chosen for a phase; the numbers follow when the user moves it. */
export interface PhaseWindow {
  fromSec: number;
  toSec: number;
}

/** Angle statistics over the frames inside a window. */
export interface AngleWindowStats {
  meanDeg: number;
  leftDeg: number;
  rightDeg: number;
  /** Sample standard deviation of the frames' mean angles; null for one frame. */
  sdDeg: number | null;
  /** Times of the first and last frame counted. */
  fromSec: number;
  toSec: number;
  frameCount: number;
}

export type SeriesWarningCode =
  | 'frames_failed'
  | 'frames_flagged'
  | 'too_few_frames'
  | 'no_advancing_phase'
  | 'no_receding_phase'
  | 'short_phase'
  | 'phase_volume_disagree'
  | 'empty_window'
  | 'no_roll_off'
  | 'downhill_side_unclear'
  | 'no_initial_angle';

export interface SeriesWarning {
  code: SeriesWarningCode;
  message: string;
}
