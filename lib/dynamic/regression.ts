/**
 * Small least-squares tools for series: a polynomial in time with the standard errors of its
 * coefficients (ordinary least squares, covariance s² (XᵀX)⁻¹; e.g. Draper & Smith, Applied
 * Regression Analysis, ch. 1 and 5) and a robust noise estimate.
 */
import { Matrix, inverse } from 'ml-matrix';

export interface PolynomialFit {
  /** c₀ + c₁ (x − origin) + c₂ (x − origin)² … */
  coefficients: number[];
  /** Standard errors of the coefficients; NaN when n ≤ degree + 1 (no residual degrees of freedom). */
  standardErrors: number[];
  origin: number;
  residualSd: number;
  n: number;
}

/** Least-squares polynomial of `degree` through (x, y), x measured from `origin`. */
export function fitPolynomial(
  x: readonly number[],
  y: readonly number[],
  degree: number,
  origin = 0,
): PolynomialFit {
  const n = x.length;
  const p = degree + 1;
  if (n < p) throw new RangeError(`A degree-${degree} fit needs at least ${p} points; ${n} given.`);
  // Scale x for conditioning; coefficients are scaled back below.
  let scale = 0;
  for (const v of x) scale = Math.max(scale, Math.abs(v - origin));
  scale = scale || 1;
  const design = new Matrix(n, p);
  for (let i = 0; i < n; i++) {
    let power = 1;
    for (let j = 0; j < p; j++) {
      design.set(i, j, power);
      power *= (x[i] - origin) / scale;
    }
  }
  const xtxInv = inverse(design.transpose().mmul(design));
  const beta = xtxInv.mmul(design.transpose()).mmul(Matrix.columnVector([...y]));
  let ssr = 0;
  for (let i = 0; i < n; i++) {
    let fitted = 0;
    for (let j = 0; j < p; j++) fitted += design.get(i, j) * beta.get(j, 0);
    ssr += (y[i] - fitted) ** 2;
  }
  const dof = n - p;
  const s2 = dof > 0 ? ssr / dof : NaN;
  const coefficients: number[] = [];
  const standardErrors: number[] = [];
  for (let j = 0; j < p; j++) {
    const unscale = scale ** j;
    coefficients.push(beta.get(j, 0) / unscale);
    standardErrors.push(Math.sqrt(s2 * xtxInv.get(j, j)) / unscale);
  }
  return { coefficients, standardErrors, origin, residualSd: Math.sqrt(s2), n };
}

/** Straight line y = intercept + slope (x − origin) with standard errors. */
export function fitLine(x: readonly number[], y: readonly number[], origin = 0) {
  const fit = fitPolynomial(x, y, 1, origin);
  return {
    intercept: fit.coefficients[0],
    slope: fit.coefficients[1],
    interceptSe: fit.standardErrors[0],
    slopeSe: fit.standardErrors[1],
    residualSd: fit.residualSd,
    n: fit.n,
  };
}

/**
 * Noise standard deviation of a sampled signal from its second differences, which remove a locally
 * straight trend: for white noise σ, Δ²y has SD σ√6; the median absolute value (× 1.4826) makes
 * the estimate robust to the few kinks where a phase changes.
 */
export function noiseFromSecondDifferences(y: readonly number[]): number {
  if (y.length < 3) return 0;
  const d: number[] = [];
  for (let i = 1; i < y.length - 1; i++) d.push(Math.abs(y[i + 1] - 2 * y[i] + y[i - 1]));
  d.sort((a, b) => a - b);
  const m = d.length % 2 ? d[d.length >> 1] : (d[d.length / 2 - 1] + d[d.length / 2]) / 2;
  return (1.4826 * m) / Math.sqrt(6);
}
