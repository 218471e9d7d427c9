/**
 * Linear least squares, the core under the algebraic circle fit and the polynomial tangent fit.
 * Columns are centred and scaled before the QR solve of ml-matrix, which keeps ill-conditioned
 * designs (e.g. high powers of large coordinates) accurate.
 */
import { Matrix, QrDecomposition } from 'ml-matrix';

export interface LeastSquaresResult {
  coefficients: number[];
  residuals: Float64Array;
  /** Residual standard deviation √(SSR / (n − p)). */
  residualSd: number;
}

/** Solves min ‖A c − y‖ for c. `design` is n rows of p values. */
export function linearLeastSquares(design: number[][], y: ArrayLike<number>): LeastSquaresResult {
  const n = design.length;
  const p = design[0].length;
  const scale = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s = Math.max(s, Math.abs(design[i][j]));
    scale[j] = s || 1;
  }
  const a = new Matrix(n, p);
  const b = new Matrix(n, 1);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < p; j++) a.set(i, j, design[i][j] / scale[j]);
    b.set(i, 0, y[i]);
  }
  const solution = new QrDecomposition(a).solve(b);
  const coefficients = Array.from({ length: p }, (_, j) => solution.get(j, 0) / scale[j]);
  const residuals = new Float64Array(n);
  let ssr = 0;
  for (let i = 0; i < n; i++) {
    let fitted = 0;
    for (let j = 0; j < p; j++) fitted += design[i][j] * coefficients[j];
    residuals[i] = y[i] - fitted;
    ssr += residuals[i] ** 2;
  }
  return { coefficients, residuals, residualSd: Math.sqrt(ssr / Math.max(n - p, 1)) };
}

/** Polynomial y ≈ Σ c_k x^k (k = 0..degree), with x centred at `origin` for conditioning. */
export function polynomialLeastSquares(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  degree: number,
): LeastSquaresResult {
  const design: number[][] = [];
  for (let i = 0; i < x.length; i++) {
    const row = [1];
    for (let k = 1; k <= degree; k++) row.push(row[k - 1] * x[i]);
    design.push(row);
  }
  return linearLeastSquares(design, y);
}
