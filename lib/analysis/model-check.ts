/**
 * Does the chosen method's model hold for this drop? Every method but Young–Laplace assumes a
 * shape (a spherical cap, an ellipse) or reads a tangent extrapolated from the nearest edge points
 * (the polynomial). The check:
 *
 * 1. Fits the Young–Laplace profile to the same edge points (a quick fit, each half on its own when
 *    the drop is asymmetric): what the residual pattern of a spherical cap leaves, gravity's
 *    flattening, gives the Bond number β.
 * 2. Generates edge points from that profile (no noise, the same spacing and margin) and lets the
 *    method measure them exactly as it measured the photo: the difference to the profile's own
 *    angle is the method's model bias for a drop of this shape.
 * 3. Compares the method's reading on the photo with the profile's angle: a larger difference than
 *    the model bias comes from the edge points (noise, the points nearest the contact line).
 *
 * A warning is raised when either exceeds `modelBiasWarnDeg`, with the size and sign, and the
 * advice to use Young–Laplace. For Young–Laplace itself the check is its residual pattern: a
 * profile that leaves a smooth, large residual does not describe this drop.
 */
import {
  fitYoungLaplace,
  youngLaplaceSidePoints,
  youngLaplaceSides,
} from './fits/young-laplace';
import { chooseSides } from './fits/two-sided';
import { rms, type FramePoints, type ProfileFit, type ProfileFitter } from './fits/types';
import type { AnalysisSettings } from './settings';
import type { AnalysisWarning, FitMethod } from './types';

export interface ModelCheck {
  /** Bond number of the Young–Laplace profile fitted to the same points (null for failures). */
  bond: number | null;
  /** The profile's angles, left and right. */
  referenceDeg: { left: number; right: number } | null;
  /** The method's reading of points generated from that profile, minus the profile's angle. */
  modelBiasDeg: { left: number; right: number } | null;
  warnings: AnalysisWarning[];
}

const LABEL: Record<FitMethod, string> = {
  circle: 'The circle (spherical cap)',
  ellipse: 'The ellipse',
  'height-width': 'The height–width (θ/2) method',
  polynomial: 'The polynomial tangent',
  'young-laplace': 'The Young–Laplace fit',
};

const ASSUMES: Record<FitMethod, string> = {
  circle: 'assumes a drop that gravity does not flatten',
  ellipse: 'assumes an elliptical outline',
  'height-width': 'assumes a spherical cap',
  polynomial: 'extrapolates a short tangent fit down to the contact line',
  'young-laplace': 'assumes an axisymmetric drop',
};

const fmt = (deg: number) => `${Math.abs(deg).toFixed(1)}°`;
const lowHigh = (deg: number) => (deg < 0 ? 'low' : 'high');

/** Model check for `fit` (the method's reported fit) of `points` (as fitted). */
export function checkModel(
  method: FitMethod,
  fitter: ProfileFitter,
  fit: ProfileFit,
  asymmetric: boolean,
  points: FramePoints,
  marginPx: number,
  settings: AnalysisSettings,
): ModelCheck {
  if (method === 'young-laplace') return checkYoungLaplace(fit);
  let reference: ProfileFit;
  try {
    // The asymmetric profiles only when the method found the two sides to differ.
    const quick = fitYoungLaplace(points, { settings, quick: true, symmetricOnly: !asymmetric });
    reference = asymmetric ? chooseSides(quick, settings).fit : quick;
  } catch {
    return { bond: null, referenceDeg: null, modelBiasDeg: null, warnings: [] };
  }
  const refAngles = reference.angles();
  if (!Number.isFinite(refAngles.leftDeg) || !Number.isFinite(refAngles.rightDeg))
    return { bond: null, referenceDeg: null, modelBiasDeg: null, warnings: [] };
  const sides = youngLaplaceSides(reference);
  if (!sides) return { bond: null, referenceDeg: null, modelBiasDeg: null, warnings: [] };
  const bond = reference.shape().bond ?? 0;

  // The same drop without noise, measured the way the photo was.
  let modelBiasDeg: ModelCheck['modelBiasDeg'] = null;
  const left = youngLaplaceSidePoints(sides[0], -1, marginPx);
  const right = youngLaplaceSidePoints(sides[1], 1, marginPx);
  const synthetic: FramePoints = {
    u: Float64Array.from([...left.u.reverse(), ...right.u]),
    v: Float64Array.from([...left.v.reverse(), ...right.v]),
    side: Int8Array.from([...left.u.map(() => -1), ...right.u.map(() => 1)]),
    axisU: (sides[0][0] + sides[1][0]) / 2,
  };
  try {
    let simulated = fitter.fit(synthetic, { settings, sameAs: fit });
    // Measured as a symmetric drop on the photo: read the symmetric fit of the generated points too.
    if (simulated.whole && !fit.whole) simulated = simulated.whole;
    const a = simulated.angles();
    const truthLeft = left.angleDeg;
    const truthRight = right.angleDeg;
    if (Number.isFinite(a.leftDeg) && Number.isFinite(a.rightDeg))
      modelBiasDeg = { left: a.leftDeg - truthLeft, right: a.rightDeg - truthRight };
  } catch {
    modelBiasDeg = null;
  }

  // Evidence first: the method's reading against the profile on this photo. Where it agrees within
  // the limit, a model bias the generated points suggest has not shown; where it does not, the
  // model bias explains it if it points the same way and has the size, else the edge points do.
  const reported = fit.angles();
  const off = {
    left: reported.leftDeg - refAngles.leftDeg,
    right: reported.rightDeg - refAngles.rightDeg,
  };
  const warnings: AnalysisWarning[] = [];
  const limit = settings.modelBiasWarnDeg;
  const explained = (side: 'left' | 'right') => {
    const bias = modelBiasDeg?.[side] ?? 0;
    return Math.abs(bias) > limit && Math.sign(bias) === Math.sign(off[side]) &&
      Math.abs(off[side] - bias) <= Math.max(limit, Math.abs(bias) / 2);
  };
  const beyond = (side: 'left' | 'right') => Math.abs(off[side]) > limit;
  if (modelBiasDeg && ((beyond('left') && explained('left')) || (beyond('right') && explained('right')))) {
    const why =
      method === 'polynomial'
        ? 'the profile bends too much between its nearest edge points and the contact line'
        : bond >= 0.05
          ? `gravity flattens this drop (Bond number ≈ ${bond.toFixed(2)})`
          : 'this drop is not that shape';
    warnings.push({
      code: 'model_bias',
      message:
        `${LABEL[method]} ${ASSUMES[method]}, but ${why}: for a drop of this shape it reads about ` +
        `${fmt(modelBiasDeg.left)} ${lowHigh(modelBiasDeg.left)} on the left and ` +
        `${fmt(modelBiasDeg.right)} ${lowHigh(modelBiasDeg.right)} on the right. Use the Young–Laplace fit.`,
    });
  }
  for (const side of ['left', 'right'] as const) {
    if (beyond(side) && !explained(side)) warnings.push(disagreement(method, side, off[side]));
  }
  return {
    bond,
    referenceDeg: { left: refAngles.leftDeg, right: refAngles.rightDeg },
    modelBiasDeg,
    warnings,
  };
}

function disagreement(method: FitMethod, side: 'left' | 'right', off: number): AnalysisWarning {
  return {
    code: 'angle_uncertain',
    message:
      `On the ${side}, ${LABEL[method].replace(/^The /, 'the ')} reads ${fmt(off)} ${off < 0 ? 'below' : 'above'} ` +
      `the Young–Laplace profile fitted to the same edge points: the points near the contact line ` +
      `are too few or too noisy for it. Treat this angle as uncertain by about ${fmt(off)}, or use the Young–Laplace fit.`,
  };
}

/**
 * Young–Laplace: a systematic residual pattern (neighbouring residuals alike, and large against
 * the edge scatter) means the profile does not describe this drop.
 */
function checkYoungLaplace(fit: ProfileFit): ModelCheck {
  const residuals = fit.residuals();
  const total = rms(residuals);
  let diff = 0;
  for (let i = 1; i < residuals.length; i++) diff += (residuals[i] - residuals[i - 1]) ** 2;
  // Scatter from neighbour differences; the smooth part is what is left of the total.
  const scatter = Math.sqrt(diff / Math.max(residuals.length - 1, 1) / 2);
  const systematic = Math.sqrt(Math.max(total * total - scatter * scatter, 0));
  const shape = fit.shape();
  const warnings: AnalysisWarning[] = [];
  if (systematic > 0.5 && systematic > 2 * scatter) {
    warnings.push({
      code: 'model_misfit',
      message: `The Young–Laplace profile leaves a systematic misfit of ${systematic.toFixed(1)} px along the outline: the drop is not axisymmetric (a needle pulling it, a contaminated or uneven surface) or the outline is disturbed. Treat the angles with care.`,
    });
  }
  const a = fit.angles();
  return {
    bond: shape.bond,
    referenceDeg: { left: a.leftDeg, right: a.rightDeg },
    modelBiasDeg: { left: 0, right: 0 },
    warnings,
  };
}
