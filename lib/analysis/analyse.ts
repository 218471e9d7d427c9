/**
 * The drop-analysis entry points: grayscale pixels in, contact angles with uncertainty out.
 * Pure TypeScript plus OpenCV (wasm); runs unchanged in a worker, in Node and in tests.
 *
 * Two stages, so that a new baseline or method re-uses the detected edges:
 * `detectDrop` (pixels → edge maps, contours, automatic baseline; once per photo) and
 * `measureDrop` (detection + method + baseline → result). `analyseDropWith` does both.
 */
import { fittedCurve } from './profile-curve';
import { loadOpenCv, type OpenCv } from './opencv';
import { pixelImage, validateImage, type PixelImage } from './image';
import { computeEdgeMaps, detectBaseline, detectMirrorBaseline, type EdgeMaps } from './detect';
import { DropOutline, type ProfileExtraction } from './outline';
import { checkModel } from './model-check';
import { chooseSides } from './fits/two-sided';
import { BaselineFrame } from './frame';
import { fitterFor } from './fits';
import {
  rms,
  type ContactAngles,
  type FramePoints,
  type ProfileFit,
  type ProfileFitter,
} from './fits/types';
import { resolveSettings, type AnalysisSettings } from './settings';
import {
  AnalysisError,
  DEFAULT_METHOD,
  type FitMethod,
  type AnalyseOptions,
  type AnalysisResult,
  type AnalysisWarning,
  type Baseline,
  type GrayImage,
  type Point,
} from './types';

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/** What `detectDrop` finds in a photo; independent of the method and of a given baseline. */
export interface DropDetection {
  readonly image: PixelImage;
  readonly offsetX: number;
  readonly offsetY: number;
  readonly settings: AnalysisSettings;
  readonly maps: EdgeMaps;
  readonly outline: DropOutline;
  /** The substrate line (or the mirror neck), in region-of-interest pixels; null if none shows. */
  readonly automaticBaseline: Baseline | null;
  readonly automaticFromMirror: boolean;
  readonly lowContrast: boolean;
  readonly timeMs: number;
  /** The newest fit per method, to start drafts from (a drag moves the baseline a little). */
  readonly warmFits: Map<FitMethod, ProfileFit>;
}

/** A frame's fit kept for the next frame of a series (see `FitCarry`). */
export interface CarriedFit {
  readonly method: FitMethod;
  readonly fit: ProfileFit;
  /** The fit's baseline frame in image pixels (the region's offset added). */
  readonly frame: BaselineFrame;
  /** Where the fit met the baseline (u in that frame). */
  readonly leftU: number;
  readonly rightU: number;
}

/**
 * Carries the fit from one frame of a series to the next (the series tracker, never a single
 * photo): `measureDrop` starts this frame's fit from `from` when the method's fit is iterative,
 * with the same stopping rules as a cold start, and falls back to a cold start when that fit fails
 * or lands away from the previous frame's drop. It leaves this frame's fit in `fit` and whether the
 * warm start was used in `warm`.
 */
export interface FitCarry {
  from: CarriedFit | null;
  fit?: CarriedFit;
  warm?: boolean;
}

/**
 * How far a warm-started fit's contact points may lie from the previous frame's before the frame is
 * fitted again from a cold start (px, or this share of the previous base diameter if larger): a
 * contact line moves a few pixels per frame; more means the fit settled on another minimum.
 */
export const WARM_START_MAX_JUMP = { px: 6, baseFraction: 0.1 };

/** Loads OpenCV (once) and analyses one drop photo. */
export async function analyseDrop(
  image: GrayImage,
  options: AnalyseOptions = {},
): Promise<AnalysisResult> {
  const { cv } = await loadOpenCv();
  return analyseDropWith(cv, image, options);
}

/** Analysis with an already loaded OpenCV instance (the worker and the CLI keep one). */
export function analyseDropWith(
  cv: OpenCv,
  input: GrayImage,
  options: AnalyseOptions = {},
  carry?: FitCarry,
): AnalysisResult {
  const started = now();
  const detection = detectDrop(cv, input, options);
  const result = measureDrop(detection, options, carry);
  result.timeMs = now() - started;
  return result;
}

/** Edge maps, contours and the automatic baseline of one photo (region of interest). */
export function detectDrop(
  cv: OpenCv,
  input: GrayImage,
  options: Pick<AnalyseOptions, 'roi' | 'settings'> = {},
): DropDetection {
  const started = now();
  validateImage(input);
  const settings = resolveSettings(options.settings);
  const { image, offsetX, offsetY } = pixelImage(input, options.roi);
  const maps = computeEdgeMaps(cv, image, settings);
  const contrast = maps.brightLevel - maps.darkLevel;
  let automaticBaseline = detectBaseline(maps, image, settings);
  let automaticFromMirror = false;
  if (!automaticBaseline) {
    automaticBaseline = detectMirrorBaseline(maps, image, settings);
    automaticFromMirror = automaticBaseline !== null;
  }
  return {
    image,
    offsetX,
    offsetY,
    settings,
    maps,
    outline: new DropOutline(maps, image, settings),
    automaticBaseline,
    automaticFromMirror,
    lowContrast:
      contrast < settings.minContrast || contrast < settings.minContrastToNoise * maps.noise,
    timeMs: now() - started,
    warmFits: new Map(),
  };
}

/** Points of the profile at least `margin` px above the baseline, in the baseline frame. */
export function toFramePoints(points: Point[], frame: BaselineFrame, margin: number): FramePoints {
  const us: number[] = [];
  const vs: number[] = [];
  let minU = Infinity;
  let maxU = -Infinity;
  for (const [x, y] of points) {
    const [u, v] = frame.toFrame(x, y);
    if (v < margin) continue;
    us.push(u);
    vs.push(v);
    minU = Math.min(minU, u);
    maxU = Math.max(maxU, u);
  }
  const axisU = (minU + maxU) / 2;
  const side = Int8Array.from(us, (u) => (u < axisU ? -1 : 1));
  return { u: Float64Array.from(us), v: Float64Array.from(vs), side, axisU };
}

function warning(code: AnalysisWarning['code'], message: string): AnalysisWarning {
  return { code, message };
}

/** Fits the detected drop for a method and baseline (the automatic one when none is given). */
export function measureDrop(
  detection: DropDetection,
  options: AnalyseOptions = {},
  carry?: FitCarry,
): AnalysisResult {
  const started = now();
  const { offsetX, offsetY, settings } = detection;
  const method = options.method ?? DEFAULT_METHOD;
  const fitter = fitterFor(method);
  if (!fitter) throw new AnalysisError('bad_input', `Unknown method "${method}".`);
  const warnings: AnalysisWarning[] = [];
  if (detection.lowContrast) {
    warnings.push(
      warning(
        'low_contrast',
        'The drop stands out only weakly from the backlight; check lighting and exposure.',
      ),
    );
  }

  let baseline: Baseline;
  let baselineSource: AnalysisResult['baselineSource'];
  if (options.baseline) {
    const b = options.baseline;
    baseline = { x1: b.x1 - offsetX, y1: b.y1 - offsetY, x2: b.x2 - offsetX, y2: b.y2 - offsetY };
    baselineSource = 'given';
  } else {
    if (!detection.automaticBaseline) {
      throw new AnalysisError(
        'baseline_not_found',
        'No substrate line was found beside the drop; drag the baseline onto the substrate surface and analyse again.',
      );
    }
    baseline = detection.automaticBaseline;
    baselineSource = 'automatic';
    if (detection.automaticFromMirror) {
      warnings.push(
        warning(
          'baseline_not_found',
          'No substrate line was visible; the baseline was placed where the drop meets its reflection. Check it and drag it if needed.',
        ),
      );
    }
  }
  let frame: BaselineFrame;
  try {
    frame = new BaselineFrame(baseline);
  } catch {
    throw new AnalysisError('bad_input', 'The baseline needs two different points.');
  }
  // The substrate line seen in the photo, to check a hand-drawn baseline against.
  const substrate =
    baselineSource === 'given' && detection.automaticBaseline && !detection.automaticFromMirror
      ? new BaselineFrame(detection.automaticBaseline)
      : null;
  const profile = detection.outline.profileFor(frame, substrate ?? undefined);
  if (!profile || profile.points.length < settings.minProfilePoints) {
    throw new AnalysisError(
      'no_drop_found',
      substrate
        ? 'No drop silhouette was found resting on this baseline; drag it onto the substrate surface where the drop meets it.'
        : 'No drop silhouette was found resting on the baseline.',
    );
  }
  if (profile.needleInContact) {
    warnings.push(
      warning(
        'needle_in_contact',
        'The needle still touches the drop; its top is hidden and the shape may be pulled.',
      ),
    );
  }
  if (profile.touchesBorder) {
    warnings.push(
      warning(
        'drop_cut_by_border',
        'The drop reaches the image border; part of its outline is missing.',
      ),
    );
  }

  const baseMargin = Math.max(settings.fitMarginPx, settings.fitMarginPerBlur * profile.edgeSpread);
  let margin = baseMargin;
  let points = toFramePoints(profile.points, frame, margin);
  const draft = options.draft === true;
  // Drafts start from the newest fit of this drop; a full result is always fitted afresh, so it is
  // the same whatever came before (and the same as the server's).
  // A series frame starts from the previous frame's fit (same stopping rules); see `FitCarry`.
  const imageFrame = carry
    ? new BaselineFrame({
        x1: baseline.x1 + offsetX,
        y1: baseline.y1 + offsetY,
        x2: baseline.x2 + offsetX,
        y2: baseline.y2 + offsetY,
      })
    : null;
  const warm =
    carry && imageFrame && !draft ? warmFit(fitter, points, settings, carry.from, imageFrame) : null;
  let fit =
    warm ??
    runFit(fitter, points, settings, draft ? detection.warmFits.get(method) : undefined, draft);
  // Above 90° the edge normal near the contact points down into the thin bright wedge between drop
  // and substrate, so the substrate edge enters the sub-pixel window; keep further off the baseline.
  const first = fit.angles();
  const firstAngle = (first.leftDeg + first.rightDeg) / 2;
  const extra =
    (baseMargin + 2) * Math.sin(((Math.min(Math.max(firstAngle, 90), 180) - 90) * Math.PI) / 180);
  // This holds for the local polynomial tangent too: its nearest points would sit in the wedge, and
  // on the generated photos the wider margin roughly halves its error at 110°–170° (MAE 2.0° → 1.5°).
  if (extra > 0.5) {
    margin = baseMargin + extra;
    points = toFramePoints(profile.points, frame, margin);
    fit = runFit(fitter, points, settings, fit, draft);
  }
  let leftCount = 0;
  for (let i = 0; i < points.side.length; i++) if (points.side[i] < 0) leftCount++;
  const rightCount = points.side.length - leftCount;
  if (leftCount < settings.minEdgePointsPerSide || rightCount < settings.minEdgePointsPerSide) {
    warnings.push(
      warning(
        'too_few_edge_points',
        `Only ${leftCount} left and ${rightCount} right edge points were usable; the angles are uncertain.`,
      ),
    );
  }

  detection.warmFits.set(method, fit);
  if (carry && imageFrame) {
    const at = fit.angles();
    carry.fit = { method, fit, frame: imageFrame, leftU: at.leftU, rightU: at.rightU };
    carry.warm = warm !== null;
  }
  // Each side from its own half-profile when the two differ by more than noise explains.
  const choice = chooseSides(fit, settings);
  const reported = choice.fit;
  if (!reported.converged)
    warnings.push(
      warning(
        'fit_did_not_converge',
        'The profile fit did not converge; treat the angles with care.',
      ),
    );
  const angles = reported.angles();
  if (!Number.isFinite(angles.leftDeg) || !Number.isFinite(angles.rightDeg)) {
    throw new AnalysisError(
      'fit_failed',
      'The fitted profile does not meet the baseline; check the baseline position.',
    );
  }
  // The fitted profile read where a baseline 1 px higher or lower would cut it.
  const up = reported.angles(undefined, 1);
  const down = reported.angles(undefined, -1);
  const shiftPart = (a: number, b: number, c: number) => {
    const value = Math.sqrt(((b - a) ** 2 + (c - a) ** 2) / 2);
    return Number.isFinite(value) ? value : 90;
  };
  const baselineShiftDeg = {
    left: shiftPart(angles.leftDeg, up.leftDeg, down.leftDeg),
    right: shiftPart(angles.rightDeg, up.rightDeg, down.rightDeg),
  };
  const se = choice.errors;
  // An angle that barely depends on the data gives a huge or undefined standard error: cap it at
  // 90° and say that this fit is not to be trusted.
  const capped = (value: number) => (Number.isFinite(value) ? Math.min(value, 90) : 90);
  const fitStandardErrorDeg = { left: capped(se.left), right: capped(se.right) };
  if (
    reported.converged &&
    (fitStandardErrorDeg.left > settings.undeterminedAngleDeg ||
      fitStandardErrorDeg.right > settings.undeterminedAngleDeg)
  ) {
    warnings.push(
      warning(
        'fit_did_not_converge',
        'The fit leaves the angle almost undetermined; try another method or check the baseline.',
      ),
    );
  }
  if (choice.asymmetric) {
    const d = angles.leftDeg - angles.rightDeg;
    warnings.push(
      warning(
        'left_right_disagree',
        `Left and right differ by ${Math.abs(d).toFixed(1)}° (the left ${d > 0 ? 'higher' : 'lower'}), more than the ±${(settings.leftRightSignificance * choice.differenceErrorDeg).toFixed(1)}° edge noise explains: the drop is not symmetric (a tilted stage, a pinned or moving contact line) or the baseline is tilted against the substrate. Each side is measured on its own half of the profile.`,
      ),
    );
  }

  const toImage = (u: number, v: number): Point => {
    const [x, y] = frame.toImage(u, v);
    return [x + offsetX, y + offsetY];
  };
  const contactLeft = toImage(angles.leftU, 0);
  const contactRight = toImage(angles.rightU, 0);

  warnings.push(
    ...checkBaseline(detection, frame, substrate, profile, angles, baselineShiftDeg, settings),
  );
  const model = draft
    ? { bond: reported.shape().bond, referenceDeg: null, modelBiasDeg: null, warnings: [] }
    : checkModel(method, fitter, reported, choice.asymmetric, points, margin, settings);
  warnings.push(...model.warnings);

  const shape = reported.shape();
  const scale = options.scalePxPerMm;
  const left: Point[] = [];
  const right: Point[] = [];
  for (let i = 0; i < points.u.length; i++)
    (points.side[i] < 0 ? left : right).push(toImage(points.u[i], points.v[i]));
  const meanDeg = (angles.leftDeg + angles.rightDeg) / 2;
  return {
    method,
    leftDeg: angles.leftDeg,
    rightDeg: angles.rightDeg,
    meanDeg,
    leftUncertaintyDeg: Math.hypot(baselineShiftDeg.left, fitStandardErrorDeg.left),
    rightUncertaintyDeg: Math.hypot(baselineShiftDeg.right, fitStandardErrorDeg.right),
    uncertaintyParts: { baselineShiftDeg, fitStandardErrorDeg },
    baseline: {
      x1: baseline.x1 + offsetX,
      y1: baseline.y1 + offsetY,
      x2: baseline.x2 + offsetX,
      y2: baseline.y2 + offsetY,
    },
    baselineSource,
    contactLeft,
    contactRight,
    baseDiameterPx: Math.abs(angles.rightU - angles.leftU),
    heightPx: shape.heightPx,
    apexRadiusPx: shape.apexRadiusPx,
    bond: shape.bond,
    modelCheck: {
      estimatedBond: model.bond,
      youngLaplaceDeg: model.referenceDeg,
      modelBiasDeg: model.modelBiasDeg,
    },
    volumePx3: shape.volumePx3,
    surfaceAreaPx2: shape.surfaceAreaPx2,
    volumeUl: scale && shape.volumePx3 !== null ? shape.volumePx3 / scale ** 3 : null,
    surfaceAreaMm2:
      scale && shape.surfaceAreaPx2 !== null ? shape.surfaceAreaPx2 / scale ** 2 : null,
    rmsResidualPx: rms(reported.residuals()),
    edgePointCount: points.u.length,
    edgePoints: { left, right },
    profile: fittedCurve(reported)?.map(([u, v]) => toImage(u, v)) ?? null,
    warnings,
    provisional: draft,
    settings,
    timeMs: now() - started,
  };
}

/**
 * Does the baseline meet the drop where the drop meets the substrate? A hand-drawn baseline is
 * compared with the substrate line found in the photo at the two contact points (where the drop's
 * outline meets that line); a baseline farther than `baselineContactTolerancePx` from one of them is
 * named as the cause, with the side, the distance, the direction and the point it misses. Without
 * a substrate line, an outline that runs along the baseline to the image border says the baseline
 * lies below the substrate's surface.
 */
function checkBaseline(
  detection: DropDetection,
  frame: BaselineFrame,
  substrate: BaselineFrame | null,
  profile: ProfileExtraction,
  angles: ContactAngles,
  sensitivity: { left: number; right: number },
  settings: AnalysisSettings,
): AnalysisWarning[] {
  const warnings: AnalysisWarning[] = [];
  const { offsetX, offsetY } = detection;
  if (substrate) {
    const contacts = detection.outline.contactsOn(substrate);
    if (!contacts) return warnings;
    for (const side of ['left', 'right'] as const) {
      const [x, y] = contacts[side];
      const miss = frame.toFrameV(x, y);
      if (Math.abs(miss) <= settings.baselineContactTolerancePx) continue;
      const end = side === 'left' ? 'left' : 'right';
      const change = Math.abs(miss) * sensitivity[side];
      warnings.push(
        warning(
          'baseline_off_contact',
          `The baseline passes ${Math.abs(miss).toFixed(1)} px ${miss > 0 ? 'below' : 'above'} the ${side} contact point (x ${(x + offsetX).toFixed(1)}, y ${(y + offsetY).toFixed(1)}), where the drop meets the substrate line found in the photo, so the ${side} angle is read ${miss > 0 ? 'below the drop, where the fitted profile is extended to the baseline' : 'on the drop above its contact line'}; about ${change.toFixed(1)}° from the value at the contact point. Drag the baseline's ${end} end onto the contact point, or use the automatic baseline.`,
        ),
      );
    }
    return warnings;
  }
  if (profile.touchesBorder && !profile.needleInContact) {
    // The outline above the baseline reaching the left or right border near the baseline is the
    // substrate's surface, not the drop: the baseline lies below it on that side.
    const { width } = detection.maps;
    for (const side of ['left', 'right'] as const) {
      const u = side === 'left' ? angles.leftU : angles.rightU;
      const [x] = frame.toImage(u, 0);
      const reaches = profile.points.some(
        ([px, py]) => (side === 'left' ? px <= 1.5 : px >= width - 2.5) && frame.toFrameV(px, py) < 12,
      );
      if (!reaches) continue;
      warnings.push(
        warning(
          'baseline_off_contact',
          `On the ${side} the outline above the baseline runs along it to the image border: the baseline lies below the substrate surface there (its ${side} end, near x ${(x + offsetX).toFixed(0)}). Drag it up onto the substrate where the drop meets it.`,
        ),
      );
    }
  }
  return warnings;
}

/**
 * The fit started from the previous frame's, or null for a cold start: no previous fit, another
 * method, a method whose fit needs no start, or a warm-started fit that failed, did not converge
 * or put a contact point more than `WARM_START_MAX_JUMP` from the previous frame's.
 */
function warmFit(
  fitter: ProfileFitter,
  points: FramePoints,
  settings: AnalysisSettings,
  from: CarriedFit | null,
  frame: BaselineFrame,
): ProfileFit | null {
  if (!from || from.method !== fitter.method || !fitter.warmStarts || points.u.length < 8)
    return null;
  // The previous frame's contact points in this frame; the shift of their midpoint moves the fit.
  const toHere = (u: number) => frame.toFrame(...from.frame.toImage(u, 0));
  const [leftU, leftV] = toHere(from.leftU);
  const [rightU, rightV] = toHere(from.rightU);
  const midU = (from.leftU + from.rightU) / 2;
  const [hereMidU, hereMidV] = toHere(midU);
  if (![leftU, leftV, rightU, rightV, hereMidU, hereMidV].every(Number.isFinite)) return null;
  let fit: ProfileFit;
  try {
    fit = fitter.fit(points, {
      settings,
      warmStart: { fit: from.fit, shiftU: hereMidU - midU, shiftV: hereMidV },
    });
  } catch {
    return null;
  }
  if (!fit.converged) return null;
  const at = fit.angles();
  const limit = Math.max(
    WARM_START_MAX_JUMP.px,
    WARM_START_MAX_JUMP.baseFraction * Math.abs(from.rightU - from.leftU),
  );
  const near = (a: number, b: number) => Number.isFinite(a) && Math.abs(a - b) <= limit;
  return near(at.leftU, leftU) && near(at.rightU, rightU) ? fit : null;
}

function runFit(
  fitter: ProfileFitter,
  points: FramePoints,
  settings: AnalysisSettings,
  previous?: ProfileFit,
  quick = false,
): ProfileFit {
  if (points.u.length < 8)
    throw new AnalysisError(
      'no_drop_found',
      'Too few edge points above the baseline to fit a profile.',
    );
  try {
    return fitter.fit(points, { previous, settings, quick });
  } catch (error) {
    if (error instanceof AnalysisError) throw error;
    throw new AnalysisError(
      'fit_failed',
      `The ${fitter.method} fit failed on these edge points (${(error as Error).message}); check the baseline or try another method.`,
    );
  }
}
