import { invertSymmetric, normalEquations } from './fits/least-squares';
import type { ProfileFit } from './fits/types';

export interface AngleStandardErrors {
  left: number;
  right: number;
  /** Lag-1 autocorrelation of the residuals along the profile (0 when uncorrelated). */
  residualCorrelation: number;
}

/**
 * Standard errors of the left and right angles from the fit itself: covariance s²(JᵀJ)⁻¹ of the
 * parameters (J the Jacobian of the residuals, s² the residual variance), propagated to the angles
 * through their numeric gradient. Neighbouring edge points are correlated (the blur and the
 * sub-pixel window span several pixels, and a model that does not quite fit leaves a smooth
 * pattern), which makes s²(JᵀJ)⁻¹ too small; the variance is therefore inflated by (1 + ρ)/(1 − ρ)
 * with ρ the lag-1 autocorrelation of the residuals along the profile, the usual correction for
 * first-order autoregressive errors (e.g. G. E. P. Box, G. M. Jenkins, *Time Series Analysis*).
 */
export function angleStandardErrors(fit: ProfileFit): AngleStandardErrors {
  const p = [...fit.parameters];
  const k = p.length;
  const r0 = fit.residuals();
  const n = r0.length;
  const nan = { left: NaN, right: NaN, residualCorrelation: 0 };
  if (n <= k) return nan;
  const jac = new Float64Array(n * k);
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
    for (let i = 0; i < n; i++) jac[i * k + j] = (rp[i] - rm[i]) / (2 * h);
    const ap = fit.angles(plus);
    const am = fit.angles(minus);
    gradLeft[j] = (ap.leftDeg - am.leftDeg) / (2 * h);
    gradRight[j] = (ap.rightDeg - am.rightDeg) / (2 * h);
  }
  let ss = 0;
  let lagged = 0;
  for (let i = 0; i < n; i++) {
    ss += r0[i] * r0[i];
    if (i > 0) lagged += r0[i] * r0[i - 1];
  }
  const rho = ss > 0 ? Math.min(0.9, Math.max(0, lagged / ss)) : 0;
  const s2 = (ss / (n - k)) * ((1 + rho) / (1 - rho));
  const jtj = new Float64Array(k * k);
  normalEquations(jac, new Float64Array(n), n, k, jtj, new Float64Array(k));
  const inverse = invertSymmetric(jtj, k);
  if (!inverse) return nan;
  const quad = (g: Float64Array) => {
    let total = 0;
    for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) total += g[a] * inverse[a * k + b] * g[b];
    return Math.sqrt(Math.max(total * s2, 0));
  };
  // An angle pinned at 0° or 180° (the model no longer crosses the baseline) has no gradient and
  // no meaningful standard error.
  const a = fit.angles();
  const pinned = (deg: number) => !(deg > 1e-6 && deg < 180 - 1e-6);
  return {
    left: pinned(a.leftDeg) ? NaN : quad(gradLeft),
    right: pinned(a.rightDeg) ? NaN : quad(gradRight),
    residualCorrelation: rho,
  };
}
