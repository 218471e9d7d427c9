/**
 * Height–width (θ/2) method: for a spherical cap tan(θ/2) = h / a, with h the drop height and a
 * half the base width. A cross-check rather than a primary method. The base width comes from the
 * polynomial tangent fit's contact points (where the profile itself meets the baseline; the
 * contact-line circle's where that tangent saturates near 180°); the height from a cap fitted to the
 * top fifth of the profile, so it also works when a needle hides the apex. Its standard error
 * covers the height only.
 */
import { fitJointCircle, fitCircleToAll, capShape } from './circle';
import { DEFAULT_SETTINGS, type AnalysisSettings } from '../settings';
import { fitPolynomial } from './polynomial';
import { DEG } from './types';
import type { ContactAngles, DropShape, FramePoints, ProfileFit, ProfileFitter } from './types';

class HeightWidthFit implements ProfileFit {
  readonly method = 'height-width' as const;
  readonly parameterNames = ['apexCentreU', 'apexCentreV', 'apexRadius'] as const;
  readonly parameters: readonly number[];
  readonly parameterSteps: readonly number[];
  readonly converged = true;
  private readonly leftU: number;
  private readonly rightU: number;
  constructor(
    private readonly apex: ProfileFit,
    /** The fit whose contact points give the base (polynomial tangent or contact-line cap). */
    private readonly contacts: ProfileFit,
  ) {
    this.parameters = apex.parameters;
    this.parameterSteps = apex.parameterSteps;
    ({ leftU: this.leftU, rightU: this.rightU } = contacts.angles());
  }
  residuals(p: readonly number[] = this.parameters): Float64Array {
    return this.apex.residuals(p);
  }
  angles(p: readonly number[] = this.parameters, baselineV = 0): ContactAngles {
    const { leftU, rightU } =
      baselineV === 0
        ? { leftU: this.leftU, rightU: this.rightU }
        : this.contacts.angles(undefined, baselineV);
    // Each side from its own half-base: the apex (centre of the apex cap) to that contact point.
    const height = p[1] + p[2] - baselineV;
    const apexU = p[0];
    return {
      leftDeg: 2 * Math.atan2(height, apexU - leftU) * DEG,
      rightDeg: 2 * Math.atan2(height, rightU - apexU) * DEG,
      leftU,
      rightU,
    };
  }
  shape(): DropShape {
    const height = this.parameters[1] + this.parameters[2];
    const half = (this.rightU - this.leftU) / 2;
    // The spherical cap with this height and base: R = (a² + h²) / 2h.
    const r = (half * half + height * height) / (2 * height);
    return capShape({ cu: 0, cv: height - r, r });
  }
}

export function fitHeightWidth(
  points: FramePoints,
  settings: AnalysisSettings = DEFAULT_SETTINGS,
): ProfileFit {
  // The base from where the profile itself meets the baseline (the polynomial tangent's contact
  // points), not from a model of the whole drop.
  let contacts = fitPolynomial(points, undefined, settings);
  // Where the polynomial's extrapolated tangent passes the horizontal (near 180°) its contact point
  // is unreliable; the contact-line cap gives the base there instead.
  const saturated = (deg: number) => !Number.isFinite(deg) || deg >= 179.5 || deg <= 0.5;
  const found = contacts.angles();
  if (saturated(found.leftDeg) || saturated(found.rightDeg))
    contacts = fitJointCircle(points, settings);
  let maxV = 0;
  for (let i = 0; i < points.v.length; i++) maxV = Math.max(maxV, points.v[i]);
  const keep: number[] = [];
  for (let i = 0; i < points.v.length; i++) if (points.v[i] >= 0.8 * maxV) keep.push(i);
  const top: FramePoints = {
    u: Float64Array.from(keep, (i) => points.u[i]),
    v: Float64Array.from(keep, (i) => points.v[i]),
    side: Int8Array.from(keep, (i) => points.side[i]),
    axisU: points.axisU,
  };
  const apex = keep.length >= 8 ? fitCircleToAll(top) : fitCircleToAll(points);
  return new HeightWidthFit(apex, contacts);
}

export const heightWidthFitter: ProfileFitter = {
  method: 'height-width',
  fit: (points, options) => fitHeightWidth(points, options?.settings),
};
