/**
 * Each side measured on its own side: a symmetric model (circle, Young–Laplace) fitted separately
 * to the left and the right half-profile, in the same baseline frame, so an asymmetric drop (a
 * tilted stage, a pinned contact line) gets its own left and right angle. Parameters are the left
 * fit's followed by the right fit's, so the standard errors of the two angles come out of the same
 * machinery as for any fit; residuals are the two halves' in turn. Size, volume and Bond number
 * come from the fit of the whole profile.
 */
import type { ContactAngles, DropShape, ProfileFit } from './types';
import type { AnalysisSettings } from '../settings';
import { angleStandardErrors, type AngleStandardErrors } from '../uncertainty';

export class TwoSidedFit implements ProfileFit {
  readonly method: ProfileFit['method'];
  readonly parameterNames: readonly string[];
  readonly parameters: readonly number[];
  readonly parameterSteps: readonly number[];
  readonly converged: boolean;
  private readonly leftCount: number;

  constructor(
    readonly left: ProfileFit,
    readonly right: ProfileFit,
    /** The fit of the whole profile (size, volume, Bond number, and the split axis). */
    readonly whole: ProfileFit,
    /** Where the two halves meet (u), for drawing. */
    readonly splitU: number,
  ) {
    this.method = whole.method;
    this.leftCount = left.parameters.length;
    this.parameters = [...left.parameters, ...right.parameters];
    this.parameterSteps = [...left.parameterSteps, ...right.parameterSteps];
    this.parameterNames = [
      ...left.parameterNames.map((name) => `left.${name}`),
      ...right.parameterNames.map((name) => `right.${name}`),
    ];
    this.converged = left.converged && right.converged;
  }

  private split(p: readonly number[]): [readonly number[], readonly number[]] {
    return [p.slice(0, this.leftCount), p.slice(this.leftCount)];
  }

  residuals(p: readonly number[] = this.parameters): Float64Array {
    const [pl, pr] = this.split(p);
    const a = this.left.residuals(pl);
    const b = this.right.residuals(pr);
    const out = new Float64Array(a.length + b.length);
    out.set(a);
    out.set(b, a.length);
    return out;
  }

  angles(p: readonly number[] = this.parameters, baselineV = 0): ContactAngles {
    const [pl, pr] = this.split(p);
    const l = this.left.angles(pl, baselineV);
    const r = this.right.angles(pr, baselineV);
    return { leftDeg: l.leftDeg, leftU: l.leftU, rightDeg: r.rightDeg, rightU: r.rightU };
  }

  shape(): DropShape {
    return this.whole.shape();
  }

  curve(samples = 160): Array<[number, number]> | null {
    const l = this.left.curve?.(samples);
    const r = this.right.curve?.(samples);
    if (!l || !r) return null;
    return [...l.filter(([u]) => u <= this.splitU), ...r.filter(([u]) => u >= this.splitU)];
  }
}

export interface SideChoice {
  /** The fit whose angles are reported: both halves, or the whole (symmetric) fit. */
  fit: ProfileFit;
  errors: AngleStandardErrors;
  /** Left and right differ by more than noise explains. */
  asymmetric: boolean;
  /** Left − right of the half-profile fits (or of the fit itself), and its standard error. */
  differenceDeg: number;
  differenceErrorDeg: number;
}

/**
 * Reports the two half-profile fits when their angles differ by more than
 * `leftRightSignificance` standard errors (and by `leftRightMinDeg`), else the fit of the whole
 * profile, which is twice as precise on a symmetric drop. Fits that are not two-sided (the local
 * polynomial, the ellipse) are reported as they are, with the same test of their difference.
 */
export function chooseSides(fit: ProfileFit, settings: AnalysisSettings): SideChoice {
  const errors = angleStandardErrors(fit);
  const angles = fit.angles();
  const differenceDeg = angles.leftDeg - angles.rightDeg;
  const differenceErrorDeg = Math.hypot(errors.left, errors.right);
  const asymmetric =
    Math.abs(differenceDeg) > settings.leftRightMinDeg &&
    Math.abs(differenceDeg) > settings.leftRightSignificance * differenceErrorDeg;
  if (fit.whole && !asymmetric) {
    return {
      fit: fit.whole,
      errors: angleStandardErrors(fit.whole),
      asymmetric,
      differenceDeg,
      differenceErrorDeg,
    };
  }
  return { fit, errors, asymmetric, differenceDeg, differenceErrorDeg };
}
