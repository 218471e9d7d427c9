import { Matrix, inverse } from 'ml-matrix';
import type { ProfileFit } from './fits/types';

/**
 * Standard errors of the left and right angles from the fit itself: covariance s²(JᵀJ)⁻¹ of the
 * parameters (J the Jacobian of the residuals, s² the residual variance), propagated to the angles
 * through their numeric gradient. Neighbouring edge points are somewhat correlated, so this is a
 * lower bound; the baseline-shift part usually dominates.
 */
export function angleStandardErrors(fit: ProfileFit): { left: number; right: number } {
  const p = [...fit.parameters];
  const k = p.length;
  const r0 = fit.residuals();
  const n = r0.length;
  if (n <= k) return { left: NaN, right: NaN };
  const jac = new Matrix(n, k);
  const gradLeft = new Float64Array(k);
  const gradRight = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    const h = fit.parameterSteps[j];
    const plus = p.slice();
    const minus = p.slice();
    plus[j] += h;
    minus[j] -= h;
    const rp = fit.residuals(plus);
    const rm = fit.residuals(minus);
    for (let i = 0; i < n; i++) jac.set(i, j, (rp[i] - rm[i]) / (2 * h));
    const ap = fit.angles(plus);
    const am = fit.angles(minus);
    gradLeft[j] = (ap.leftDeg - am.leftDeg) / (2 * h);
    gradRight[j] = (ap.rightDeg - am.rightDeg) / (2 * h);
  }
  let ss = 0;
  for (let i = 0; i < n; i++) ss += r0[i] * r0[i];
  const s2 = ss / (n - k);
  let cov: Matrix;
  try {
    cov = inverse(jac.transpose().mmul(jac)).mul(s2);
  } catch {
    return { left: NaN, right: NaN };
  }
  const quad = (g: Float64Array) => {
    let total = 0;
    for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) total += g[a] * cov.get(a, b) * g[b];
    return Math.sqrt(Math.max(total, 0));
  };
  return { left: quad(gradLeft), right: quad(gradRight) };
}
