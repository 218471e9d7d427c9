/**
 * Every tuning value of the drop analysis, in one documented object with keyword defaults (in the
 * manner of scikit-image's documented defaults, e.g. `canny(sigma=1.0, low_threshold=None, …)`).
 * `analyseDrop(image, { settings })` accepts any subset; the result carries the complete settings
 * it used (`result.settings`), and a saved analysis stores them, so photo + method + baseline +
 * settings reproduce the result.
 *
 * Intensities are on the 0–255 scale (16-bit photos are read on the same scale); "contrast" is the
 * difference between the mean backlight and the mean silhouette level of the photo.
 */
import { AnalysisError } from './types';

export interface AnalysisSettings {
  /**
   * Gaussian denoising σ (px) before the silhouette is split from the backlight (kernel ±2σ).
   * `'auto'`: max(1, min(width, height) / 1600), so very large photos get a little more.
   */
  denoiseSigmaPx: number | 'auto';
  /**
   * Half-length (px) of the sub-pixel edge search along the normal. `'auto'`:
   * max(4, min(width, height) / 320), which covers the wider edge blur of large photos.
   */
  edgeSearchHalfWidthPx: number | 'auto';
  /** Below this contrast (0–255) the photo is flagged low-contrast. */
  minContrast: number;
  /** … or below this multiple of the background noise. */
  minContrastToNoise: number;

  /** A substrate-surface step must darken by at least this share of the contrast. */
  substrateStepShare: number;
  /** Steepest substrate tilt (degrees) the automatic baseline accepts. */
  baselineMaxTiltDeg: number;
  /** RANSAC line candidates tried for the automatic baseline. */
  baselineRansacTrials: number;
  /** Distance (px) within which a substrate point supports a candidate line. */
  baselineInlierPx: number;
  /** Fewest substrate points (share of the scanned columns; at least 12) for a baseline. */
  baselineMinColumnShare: number;
  /** Seed of the RANSAC generator, so the same photo always gives the same baseline. */
  baselineSeed: number;

  /** The silhouette is cut this far (px) above the baseline; below it lies the substrate's edge. */
  cutAboveBaselinePx: number;
  /** Dark regions smaller than this (px²) are ignored (dust). */
  minRegionAreaPx2: number;
  /** A region reaching the top border over less than this share of its width is a needle. */
  needleMaxWidthShare: number;
  /** A sub-pixel edge must rise by at least this share of the contrast… */
  edgeMinRiseShare: number;
  /** …and lie within this distance (px) of its contour pixel. */
  edgeMaxShiftPx: number;
  /** Edge points farther than this (px) from the chord of their neighbours are outliers. */
  outlierChordPx: number;
  /** Fewest sub-pixel points of a whole silhouette. */
  minProfilePoints: number;

  /** Points closer to the baseline than max(this, fitMarginPerBlur × edge blur σ) are not fitted. */
  fitMarginPx: number;
  fitMarginPerBlur: number;
  /** Fewer usable points than this on a side raises `too_few_edge_points`. */
  minEdgePointsPerSide: number;

  /** Circle: the contact-line window reaches this share of the radius beyond the nearest point. */
  circleContactWindow: number;
  /** Polynomial: a quartic is used above this angle (degrees)… */
  polynomialQuarticAboveDeg: number;
  /** …when the edge scatter (px) is below this. */
  polynomialQuarticMaxScatterPx: number;
  /** Young–Laplace: the largest Bond number the fit may reach. */
  youngLaplaceMaxBond: number;

  /** Left and right differing by more than this many combined standard errors is reported. */
  leftRightSignificance: number;
  /** …and by at least this many degrees. */
  leftRightMinDeg: number;
  /** A method whose expected model bias exceeds this (degrees) warns that its model does not hold. */
  modelBiasWarnDeg: number;
  /** A baseline farther than this (px) from where the drop meets the substrate is named as the cause. */
  baselineContactTolerancePx: number;
  /** A fit standard error above this (degrees) means the angle is practically undetermined. */
  undeterminedAngleDeg: number;
}

export const DEFAULT_SETTINGS: Readonly<AnalysisSettings> = Object.freeze({
  denoiseSigmaPx: 'auto',
  edgeSearchHalfWidthPx: 'auto',
  minContrast: 40,
  minContrastToNoise: 10,

  substrateStepShare: 0.12,
  baselineMaxTiltDeg: 20,
  baselineRansacTrials: 300,
  baselineInlierPx: 1,
  baselineMinColumnShare: 0.06,
  baselineSeed: 12345,

  cutAboveBaselinePx: 2,
  minRegionAreaPx2: 50,
  needleMaxWidthShare: 0.35,
  edgeMinRiseShare: 0.35,
  edgeMaxShiftPx: 3,
  outlierChordPx: 0.75,
  minProfilePoints: 10,

  fitMarginPx: 3,
  fitMarginPerBlur: 2.5,
  minEdgePointsPerSide: 15,

  circleContactWindow: 0.2,
  polynomialQuarticAboveDeg: 140,
  polynomialQuarticMaxScatterPx: 0.01,
  youngLaplaceMaxBond: 20,

  leftRightSignificance: 3,
  leftRightMinDeg: 0.5,
  modelBiasWarnDeg: 0.5,
  baselineContactTolerancePx: 1.5,
  undeterminedAngleDeg: 30,
} satisfies AnalysisSettings);

/** The defaults with `overrides` applied; unknown keys and values that do not fit are refused. */
export function resolveSettings(overrides?: Partial<AnalysisSettings>): AnalysisSettings {
  const settings: AnalysisSettings = { ...DEFAULT_SETTINGS };
  if (!overrides) return settings;
  for (const key of Object.keys(overrides)) {
    if (!(key in DEFAULT_SETTINGS)) {
      throw new AnalysisError(
        'bad_input',
        `There is no analysis setting "${key}"; the settings are ${Object.keys(DEFAULT_SETTINGS).join(', ')}.`,
      );
    }
  }
  for (const key of Object.keys(DEFAULT_SETTINGS) as Array<keyof AnalysisSettings>) {
    const value = overrides[key];
    if (value === undefined) continue;
    const auto = DEFAULT_SETTINGS[key] === 'auto';
    if (!(auto && value === 'auto') && !(typeof value === 'number' && Number.isFinite(value))) {
      throw new AnalysisError(
        'bad_input',
        `Setting ${key} must be a finite number${auto ? " or 'auto'" : ''}; got ${JSON.stringify(value)}.`,
      );
    }
    (settings as unknown as Record<string, unknown>)[key] = value;
  }
  return settings;
}

/** Denoising σ for an image of this size. */
export function denoiseSigma(settings: AnalysisSettings, width: number, height: number): number {
  return settings.denoiseSigmaPx === 'auto'
    ? Math.max(1, Math.min(width, height) / 1600)
    : settings.denoiseSigmaPx;
}

/** Half-length of the sub-pixel search along the normal for an image of this size. */
export function edgeSearchHalfWidth(
  settings: AnalysisSettings,
  width: number,
  height: number,
): number {
  return settings.edgeSearchHalfWidthPx === 'auto'
    ? Math.max(4, Math.min(width, height) / 320)
    : settings.edgeSearchHalfWidthPx;
}
