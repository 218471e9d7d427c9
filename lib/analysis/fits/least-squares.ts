/**
 * The least-squares core under every fit.
 *
 * - `linearLeastSquares` / `polynomialLeastSquares`: Householder QR (G. H. Golub & C. F. Van Loan,
 *   *Matrix Computations*, 4th ed., §5.3) on columns scaled to unit size, which keeps
 *   ill-conditioned designs (high powers of large coordinates) accurate.
 * - `levenbergMarquardt`: damped Gauss–Newton for nonlinear fits with an analytic Jacobian
 *   (K. Levenberg 1944, D. W. Marquardt 1963; damping scaled by diag(JᵀJ) as Marquardt proposed).
 *
 * Both work on flat typed arrays. ml-matrix (used elsewhere, and by the tests as a cross-check)
 * keeps one object per row and one call per element; at the sizes of a drop fit (a few hundred
 * points, 3–5 parameters, thousands of solves per drag) that costs more than the fits themselves.
 */

export interface LeastSquaresResult {
  coefficients: number[];
  residuals: Float64Array;
  /** Residual standard deviation √(SSR / (n − p)). */
  residualSd: number;
}

/**
 * Solves min ‖A c − y‖ for c. `design` is n rows of p values (or a flat row-major array with p
 * given). Throws when the columns are linearly dependent.
 */
export function linearLeastSquares(
  design: number[][] | Float64Array,
  y: ArrayLike<number>,
  columns?: number,
): LeastSquaresResult {
  const flat = design instanceof Float64Array;
  const n = flat ? y.length : design.length;
  const p = flat ? (columns as number) : design[0].length;
  const at = (i: number, j: number) => (flat ? design[i * p + j] : design[i][j]);
  // Column-major copy, each column scaled to unit largest magnitude.
  const a = new Float64Array(n * p);
  const scale = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s = Math.max(s, Math.abs(at(i, j)));
    scale[j] = s || 1;
    for (let i = 0; i < n; i++) a[j * n + i] = at(i, j) / scale[j];
  }
  const b = Float64Array.from(y);
  const diagonal = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    const col = j * n;
    let norm = 0;
    for (let i = j; i < n; i++) norm += a[col + i] * a[col + i];
    norm = Math.sqrt(norm);
    if (norm === 0) throw new Error('The least-squares design has dependent columns.');
    const alpha = a[col + j] > 0 ? -norm : norm;
    // Householder vector v = x − α e₁, stored in place of the column below the diagonal.
    a[col + j] -= alpha;
    let vv = 0;
    for (let i = j; i < n; i++) vv += a[col + i] * a[col + i];
    diagonal[j] = alpha;
    if (vv === 0) continue;
    for (let k = j + 1; k < p; k++) {
      const other = k * n;
      let dot = 0;
      for (let i = j; i < n; i++) dot += a[col + i] * a[other + i];
      const f = (2 * dot) / vv;
      for (let i = j; i < n; i++) a[other + i] -= f * a[col + i];
    }
    let dot = 0;
    for (let i = j; i < n; i++) dot += a[col + i] * b[i];
    const f = (2 * dot) / vv;
    for (let i = j; i < n; i++) b[i] -= f * a[col + i];
  }
  const c = new Float64Array(p);
  for (let j = p - 1; j >= 0; j--) {
    let sum = b[j];
    for (let k = j + 1; k < p; k++) sum -= a[k * n + j] * c[k];
    if (Math.abs(diagonal[j]) < 1e-13) throw new Error('The least-squares design has dependent columns.');
    c[j] = sum / diagonal[j];
  }
  const coefficients = Array.from(c, (value, j) => value / scale[j]);
  const residuals = new Float64Array(n);
  let ssr = 0;
  for (let i = 0; i < n; i++) {
    let fitted = 0;
    for (let j = 0; j < p; j++) fitted += at(i, j) * coefficients[j];
    residuals[i] = y[i] - fitted;
    ssr += residuals[i] ** 2;
  }
  return { coefficients, residuals, residualSd: Math.sqrt(ssr / Math.max(n - p, 1)) };
}

/** Polynomial y ≈ Σ c_k x^k (k = 0..degree). */
export function polynomialLeastSquares(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  degree: number,
): LeastSquaresResult {
  const p = degree + 1;
  const design = new Float64Array(x.length * p);
  for (let i = 0; i < x.length; i++) {
    let power = 1;
    for (let k = 0; k < p; k++) {
      design[i * p + k] = power;
      power *= x[i];
    }
  }
  return linearLeastSquares(design, y, p);
}

/**
 * Solves the symmetric positive (semi)definite system M x = r (k × k, row-major) by Cholesky;
 * null when M is singular.
 */
export function solveSymmetric(m: Float64Array, r: Float64Array, k: number): Float64Array | null {
  const l = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = m[i * k + j];
      for (let q = 0; q < j; q++) sum -= l[i * k + q] * l[j * k + q];
      if (i === j) {
        if (!(sum > 0)) return null;
        l[i * k + i] = Math.sqrt(sum);
      } else l[i * k + j] = sum / l[j * k + j];
    }
  }
  const z = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    let sum = r[i];
    for (let q = 0; q < i; q++) sum -= l[i * k + q] * z[q];
    z[i] = sum / l[i * k + i];
  }
  const x = new Float64Array(k);
  for (let i = k - 1; i >= 0; i--) {
    let sum = z[i];
    for (let q = i + 1; q < k; q++) sum -= l[q * k + i] * x[q];
    x[i] = sum / l[i * k + i];
  }
  return x;
}

/**
 * Inverse of a symmetric positive definite k × k matrix (row-major); null when singular. The
 * matrix is equilibrated first (scaled to a unit diagonal), so parameters of very different sizes
 * (polynomial coefficients, conic coefficients) do not defeat the factorisation.
 */
export function invertSymmetric(m: Float64Array, k: number): Float64Array | null {
  const d = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    if (!(m[i * k + i] > 0)) return null;
    d[i] = 1 / Math.sqrt(m[i * k + i]);
  }
  const scaled = new Float64Array(k * k);
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) scaled[i * k + j] = m[i * k + j] * d[i] * d[j];
  const out = new Float64Array(k * k);
  const unit = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    unit.fill(0);
    unit[j] = 1;
    const column = solveSymmetric(scaled, unit, k);
    if (!column) return null;
    for (let i = 0; i < k; i++) out[i * k + j] = column[i] * d[i] * d[j];
  }
  return out;
}

/** Residuals r (length n) and Jacobian J (n × k, row-major) of a model at parameters p. */
export type ResidualFunction = (p: Float64Array, r: Float64Array, jacobian: Float64Array) => void;

export interface LevenbergMarquardtOptions {
  maxIterations?: number;
  /** Stop when no parameter moves by more than this share of its tolerance scale. */
  stepTolerance?: number;
  /** Per-parameter scale for the step test (default: 1 for every parameter). */
  parameterScale?: ArrayLike<number>;
  lower?: ArrayLike<number>;
  upper?: ArrayLike<number>;
  initialDamping?: number;
}

export interface LevenbergMarquardtResult {
  parameters: Float64Array;
  /** Sum of squared residuals at the result. */
  cost: number;
  iterations: number;
  converged: boolean;
}

/** Minimises Σ rᵢ(p)² from `start`, within optional bounds. */
export function levenbergMarquardt(
  n: number,
  start: ArrayLike<number>,
  model: ResidualFunction,
  options: LevenbergMarquardtOptions = {},
): LevenbergMarquardtResult {
  const k = start.length;
  const maxIterations = options.maxIterations ?? 30;
  const tolerance = options.stepTolerance ?? 1e-8;
  const lower = options.lower;
  const upper = options.upper;
  const clampTo = (p: Float64Array) => {
    for (let j = 0; j < k; j++) {
      if (lower && p[j] < lower[j]) p[j] = lower[j];
      if (upper && p[j] > upper[j]) p[j] = upper[j];
    }
  };
  const p = Float64Array.from(start);
  clampTo(p);
  let r = new Float64Array(n);
  let jac = new Float64Array(n * k);
  let tryR = new Float64Array(n);
  let tryJ = new Float64Array(n * k);
  model(p, r, jac);
  let cost = sumOfSquares(r);
  let lambda = options.initialDamping ?? 1e-3;
  const jtj = new Float64Array(k * k);
  const jtr = new Float64Array(k);
  const damped = new Float64Array(k * k);
  const trial = new Float64Array(k);
  let iterations = 0;
  let converged = false;
  while (!converged && iterations < maxIterations && Number.isFinite(cost)) {
    iterations++;
    normalEquations(jac, r, n, k, jtj, jtr);
    let accepted = false;
    let largest = Infinity;
    for (let attempt = 0; attempt < 12 && !accepted; attempt++) {
      damped.set(jtj);
      for (let j = 0; j < k; j++) damped[j * k + j] += lambda * (jtj[j * k + j] || 1e-12);
      const step = solveSymmetric(damped, jtr, k);
      if (!step) {
        lambda *= 10;
        continue;
      }
      largest = 0;
      for (let j = 0; j < k; j++) {
        trial[j] = p[j] - step[j];
        largest = Math.max(largest, Math.abs(step[j]) / (options.parameterScale?.[j] ?? 1));
      }
      clampTo(trial);
      model(trial, tryR, tryJ);
      const trialCost = sumOfSquares(tryR);
      if (trialCost <= cost) {
        [r, tryR] = [tryR, r];
        [jac, tryJ] = [tryJ, jac];
        p.set(trial);
        cost = trialCost;
        lambda = Math.max(lambda / 10, 1e-12);
        accepted = true;
      } else {
        lambda *= 10;
      }
      if (largest < tolerance) break;
    }
    // A step too small to matter, or no step that lowers the cost: at the minimum.
    if (largest < tolerance || !accepted) converged = true;
  }
  return { parameters: p, cost, iterations, converged: converged && Number.isFinite(cost) };
}

/** JᵀJ (k × k) and Jᵀr (k) of an n × k row-major Jacobian. */
export function normalEquations(
  jac: Float64Array,
  r: Float64Array,
  n: number,
  k: number,
  jtj: Float64Array,
  jtr: Float64Array,
): void {
  jtj.fill(0);
  jtr.fill(0);
  for (let i = 0; i < n; i++) {
    const row = i * k;
    const ri = r[i];
    for (let a = 0; a < k; a++) {
      const ja = jac[row + a];
      jtr[a] += ja * ri;
      for (let b = 0; b <= a; b++) jtj[a * k + b] += ja * jac[row + b];
    }
  }
  for (let a = 0; a < k; a++) for (let b = a + 1; b < k; b++) jtj[a * k + b] = jtj[b * k + a];
}

export function sumOfSquares(r: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < r.length; i++) s += r[i] * r[i];
  return s;
}
