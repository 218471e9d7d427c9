import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { SurfaceEnergyInputError } from './errors';
import type { AngleMeasurement } from './types';
import { assertMeasurements, assertTension, toRadians } from './validate';

export interface AcidBaseResult {
  method: 'van Oss–Chaudhury–Good acid–base (Lifshitz–van der Waals + Lewis acid/base)';
  gammaLW: number;
  /** Electron-acceptor (acid) component γS+. */
  gammaPlus: number;
  /** Electron-donor (base) component γS−. */
  gammaMinus: number;
  /** Acid–base part 2√(γS+ γS−). */
  gammaAB: number;
  gammaTotal: number;
  /** Condition number of the liquids' matrix; large values mean the liquids hardly separate the components. */
  conditionNumber: number;
  /** Largest |residual| of the liquids' equations (0 for exactly three liquids), mN/m. */
  maxResidual: number;
  warnings: string[];
}

/** Above this condition number the liquid set is treated as unable to separate the three components. */
const MAX_CONDITION = 1e6;

/**
 * van Oss–Chaudhury–Good acid–base surface free energy (van Oss, Chaudhury & Good, Chem. Rev.
 * 88, 1988): γL(1 + cos θ)/2 = √(γS^LW γL^LW) + √(γS+ γL−) + √(γS− γL+), linear in
 * (√γS^LW, √γS+, √γS−). Three liquids give a 3×3 system, more a least-squares one (solved by
 * singular value decomposition). Total = γLW + 2√(γ+γ−).
 */
export function acidBase(measurements: readonly AngleMeasurement[]): AcidBaseResult {
  assertMeasurements(measurements, 3, 'The acid–base (van Oss–Chaudhury–Good) method');
  const rows: number[][] = [];
  const rhs: number[] = [];
  for (const m of measurements) {
    const where = `Liquid "${m.liquid.name}"`;
    const total = assertTension(m.liquid.gammaTotal, 'total surface tension', where, false);
    const lw = assertTension(m.liquid.gammaLW, 'Lifshitz–van der Waals component γLW', where);
    const plus = assertTension(m.liquid.gammaPlus, 'acid component γ+', where);
    const minus = assertTension(m.liquid.gammaMinus, 'base component γ−', where);
    if (Math.abs(lw + 2 * Math.sqrt(plus * minus) - total) > 0.5) {
      throw new SurfaceEnergyInputError(
        'components-mismatch',
        `${where}: γLW + 2√(γ+γ−) = ${(lw + 2 * Math.sqrt(plus * minus)).toFixed(2)} should equal the total ${total} mN/m; correct the liquid's values.`,
      );
    }
    rows.push([Math.sqrt(lw), Math.sqrt(minus), Math.sqrt(plus)]);
    rhs.push((total * (1 + Math.cos(toRadians(m.angleDeg)))) / 2);
  }
  const A = new Matrix(rows);
  const svd = new SingularValueDecomposition(A, { autoTranspose: true });
  const conditionNumber = svd.condition;
  if (!(conditionNumber < MAX_CONDITION) || svd.rank < 3) {
    throw new SurfaceEnergyInputError(
      'degenerate',
      'These liquids cannot separate the three acid–base components (their components are proportional). Use one apolar liquid (e.g. diiodomethane) and two polar liquids of different acid/base balance (e.g. water and formamide).',
    );
  }
  const solution = svd.solve(Matrix.columnVector(rhs)).to1DArray();
  const [rootLW, rootPlus, rootMinus] = solution;
  const warnings: string[] = [];
  const square = (root: number, label: string) => {
    if (root < 0) {
      warnings.push(
        `The fit gives a negative √${label}; ${label} is set to 0. Check the angles or use another liquid set.`,
      );
      return 0;
    }
    return root * root;
  };
  const gammaLW = square(rootLW, 'γLW');
  const gammaPlus = square(rootPlus, 'γ+');
  const gammaMinus = square(rootMinus, 'γ−');
  const gammaAB = 2 * Math.sqrt(gammaPlus * gammaMinus);
  const maxResidual = Math.max(
    ...rows.map((r, i) => Math.abs(r[0] * rootLW + r[1] * rootPlus + r[2] * rootMinus - rhs[i])),
  );
  if (conditionNumber > 100) {
    warnings.push(
      `The liquid set is poorly conditioned (condition number ${conditionNumber.toFixed(0)}); small angle errors move the components a lot.`,
    );
  }
  return {
    method: 'van Oss–Chaudhury–Good acid–base (Lifshitz–van der Waals + Lewis acid/base)',
    gammaLW,
    gammaPlus,
    gammaMinus,
    gammaAB,
    gammaTotal: gammaLW + gammaAB,
    conditionNumber,
    maxResidual,
    warnings,
  };
}
