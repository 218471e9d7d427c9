import type { AnalysisSettings } from './settings';
import { CodedError } from '../coded-error';

/**
 * Public types of the drop-analysis engine. Everything here is plain data so it can cross a
 * worker boundary (structured clone) unchanged.
 *
 * Coordinates: image pixels, origin at the top-left pixel centre, x right, y down. Pixel (i, j)
 * covers [i − ½, i + ½] × [j − ½, j + ½].
 */

/** Grayscale pixels, row-major. 8-bit (0–255) or 16-bit (0–65535) samples; colour is converted by the caller. */
export interface GrayImage {
  width: number;
  height: number;
  data: Uint8Array | Uint8ClampedArray | Uint16Array;
}

export type FitMethod = 'circle' | 'polynomial' | 'ellipse' | 'young-laplace' | 'height-width';

export const FIT_METHODS: readonly FitMethod[] = [
  'circle',
  'polynomial',
  'ellipse',
  'young-laplace',
  'height-width',
];

/** The method used when none is asked for (the most accurate one on the generated fixtures). */
export const DEFAULT_METHOD: FitMethod = 'young-laplace';

/** A baseline as two image points (the substrate line through them). */
export interface Baseline {
  x1: number;
  y1: number;
  x2: number;
  y2: number;
}

export interface RegionOfInterest {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface AnalyseOptions {
  method?: FitMethod;
  /** Used exactly as given (e.g. the user's drag); found automatically when absent. */
  baseline?: Baseline;
  /** Only this rectangle of the image is analysed; results stay in full-image pixels. */
  roi?: RegionOfInterest;
  /** Camera scale; when given, volume and area are also reported in µL and mm². */
  scalePxPerMm?: number;
  /** Tuning values; any not given take their documented defaults (lib/analysis/settings.ts). */
  settings?: Partial<AnalysisSettings>;
  /**
   * A quick provisional result, e.g. while a baseline is dragged: Young–Laplace with fewer points
   * and iterations, and no model check. The result says `provisional: true`.
   */
  draft?: boolean;
}

export type WarningCode =
  | 'left_right_disagree'
  | 'low_contrast'
  | 'drop_cut_by_border'
  | 'needle_in_contact'
  | 'too_few_edge_points'
  | 'baseline_not_found'
  | 'baseline_off_contact'
  | 'fit_did_not_converge'
  | 'model_bias'
  | 'model_misfit'
  | 'angle_uncertain';

export interface AnalysisWarning {
  code: WarningCode;
  message: string;
}

export type AnalysisErrorCode = 'no_drop_found' | 'baseline_not_found' | 'fit_failed' | 'bad_input';

/** Thrown by `analyseDrop` when no result can be produced at all. */
export class AnalysisError extends CodedError<AnalysisErrorCode> {
  override readonly name = 'AnalysisError';
}

export type Point = [number, number];

export interface ModelCheckSummary {
  /**
   * Bond number of the Young–Laplace profile fitted to the same edge points (for Young–Laplace its
   * own); poorly determined on flat drops (below about 30°). Null when that fit failed.
   */
  estimatedBond: number | null;
  /** That profile's left and right angles. */
  youngLaplaceDeg: { left: number; right: number } | null;
  /**
   * The method's reading of edge points generated from that profile (no noise, same spacing and
   * margin) minus the profile's own angle: the bias of the method's model for this drop's shape.
   */
  modelBiasDeg: { left: number; right: number } | null;
}

export interface AnalysisResult {
  method: FitMethod;
  leftDeg: number;
  rightDeg: number;
  meanDeg: number;
  /** Combined standard uncertainty: ±1 px baseline shift and the fit's standard error, in quadrature. */
  leftUncertaintyDeg: number;
  rightUncertaintyDeg: number;
  /** The two parts of the uncertainty, for display. */
  uncertaintyParts: {
    baselineShiftDeg: { left: number; right: number };
    fitStandardErrorDeg: { left: number; right: number };
  };
  baseline: Baseline;
  baselineSource: 'automatic' | 'given';
  contactLeft: Point;
  contactRight: Point;
  baseDiameterPx: number;
  heightPx: number;
  apexRadiusPx: number | null;
  /** Bond number β = Δρ g b² / γ (apex radius b), only for the Young–Laplace fit. */
  bond: number | null;
  /** Whether the method's model holds for this drop (lib/analysis/model-check.ts). */
  modelCheck: ModelCheckSummary;
  volumePx3: number | null;
  surfaceAreaPx2: number | null;
  volumeUl: number | null;
  surfaceAreaMm2: number | null;
  rmsResidualPx: number;
  edgePointCount: number;
  /** Sub-pixel edge points used by the fit (image pixels), for overlays. */
  edgePoints: { left: Point[]; right: Point[] };
  /** The fitted profile (image pixels), left contact over the apex to the right contact; null for local fits. */
  profile: Point[] | null;
  warnings: AnalysisWarning[];
  /** True for a quick draft (`AnalyseOptions.draft`), to be followed by the full result. */
  provisional: boolean;
  /** The complete settings used, so the result can be reproduced. */
  settings: AnalysisSettings;
  /** Milliseconds from decoded pixels to result. */
  timeMs: number;
}
