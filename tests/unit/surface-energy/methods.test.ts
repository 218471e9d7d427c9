/**
 * Surface free energy methods on the Ström, Fredriksson & Stenius (1987) liquid set (values
 * from memory, see lib/surface-energy/liquids.ts and liquids.test.ts). Each check inverts
 * angles that the test itself forward-computes from an assumed solid with the published
 * equation, or compares to a closed-form solve written here — independent of the code under
 * test.
 */
import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import {
  acidBase,
  fowkes,
  neumann,
  neumannCosTheta,
  owrk,
  PROBE_LIQUIDS,
  SurfaceEnergyInputError,
  wu,
  zisman,
  type AngleMeasurement,
  type LiquidComponents,
} from '@/lib/surface-energy';

const { water, diiodomethane, formamide, glycerol } = PROBE_LIQUIDS;
const ethyleneGlycol = PROBE_LIQUIDS['ethylene-glycol'];
const STROM = [water, diiodomethane, ethyleneGlycol, formamide, glycerol];
const deg = (rad: number) => (rad * 180) / Math.PI;
const rad = (d: number) => (d * Math.PI) / 180;

/** Geometric mean (Owens & Wendt 1969): γL(1 + cos θ) = 2(√(γSd γLd) + √(γSp γLp)). */
function owrkAngle(sd: number, sp: number, l: LiquidComponents): number {
  return deg(
    Math.acos(
      (2 * (Math.sqrt(sd * l.gammaDispersive) + Math.sqrt(sp * l.gammaPolar))) / l.gammaTotal - 1,
    ),
  );
}
/** Harmonic mean (Wu 1971): γL(1 + cos θ) = 4(γSd γLd/(γSd+γLd) + γSp γLp/(γSp+γLp)). */
function wuAngle(sd: number, sp: number, l: LiquidComponents): number {
  const h = (a: number, b: number) => (a + b > 0 ? (a * b) / (a + b) : 0);
  return deg(Math.acos((4 * (h(sd, l.gammaDispersive) + h(sp, l.gammaPolar))) / l.gammaTotal - 1));
}
/** van Oss–Chaudhury–Good 1988: γL(1 + cos θ)/2 = √(γS^LW γL^LW) + √(γS+ γL−) + √(γS− γL+). */
function acidBaseAngle(lw: number, plus: number, minus: number, l: LiquidComponents): number {
  const s =
    Math.sqrt(lw * (l.gammaLW as number)) +
    Math.sqrt(plus * (l.gammaMinus as number)) +
    Math.sqrt(minus * (l.gammaPlus as number));
  return deg(Math.acos((2 * s) / l.gammaTotal - 1));
}

describe('OWRK (Owens & Wendt 1969; Kaelble 1970; Rabel 1971)', () => {
  it('recovers an assumed solid (γSd 28, γSp 6 mN/m) from angles forward-computed for all five Ström liquids', () => {
    const ms = STROM.map((liquid) => ({ liquid, angleDeg: owrkAngle(28, 6, liquid) }));
    const r = owrk(ms);
    expect(r.gammaDispersive).toBeCloseTo(28, 9);
    expect(r.gammaPolar).toBeCloseTo(6, 9);
    expect(r.gammaTotal).toBeCloseTo(34, 9);
    expect(r.rSquared).toBeCloseTo(1, 12);
    expect(r.points).toHaveLength(5);
  });

  it('two liquids agree with a closed-form 2×2 solve (Cramer’s rule) of the geometric-mean equations', () => {
    // Unknowns a = √γSd, b = √γSp: √γLd·a + √γLp·b = γL(1 + cos θ)/2 for water (75°) and
    // ethylene glycol (52°), arbitrary angles.
    const pairs: AngleMeasurement[] = [
      { liquid: water, angleDeg: 75 },
      { liquid: ethyleneGlycol, angleDeg: 52 },
    ];
    const [m1, m2] = pairs;
    const a11 = Math.sqrt(m1.liquid.gammaDispersive);
    const a12 = Math.sqrt(m1.liquid.gammaPolar);
    const a21 = Math.sqrt(m2.liquid.gammaDispersive);
    const a22 = Math.sqrt(m2.liquid.gammaPolar);
    const b1 = (m1.liquid.gammaTotal * (1 + Math.cos(rad(m1.angleDeg)))) / 2;
    const b2 = (m2.liquid.gammaTotal * (1 + Math.cos(rad(m2.angleDeg)))) / 2;
    const det = a11 * a22 - a12 * a21;
    const a = (b1 * a22 - a12 * b2) / det;
    const b = (a11 * b2 - b1 * a21) / det;
    const r = owrk(pairs);
    expect(r.gammaDispersive).toBeCloseTo(a * a, 9);
    expect(r.gammaPolar).toBeCloseTo(b * b, 9);
  });

  it('three noisy liquids: slope, intercept and R² agree with an independent least-squares solve (ml-matrix)', () => {
    const ms = [
      { liquid: water, angleDeg: 88 },
      { liquid: diiodomethane, angleDeg: 48 },
      { liquid: formamide, angleDeg: 66 },
    ];
    const x = ms.map((m) => Math.sqrt(m.liquid.gammaPolar / m.liquid.gammaDispersive));
    const y = ms.map(
      (m) =>
        (m.liquid.gammaTotal * (1 + Math.cos(rad(m.angleDeg)))) /
        (2 * Math.sqrt(m.liquid.gammaDispersive)),
    );
    const coef = solve(new Matrix(x.map((xi) => [1, xi])), Matrix.columnVector(y)).to1DArray();
    const r = owrk(ms);
    expect(r.intercept).toBeCloseTo(coef[0], 9);
    expect(r.slope).toBeCloseTo(coef[1], 9);
    const my = y.reduce((s, v) => s + v, 0) / 3;
    const sse = y.reduce((s, v, i) => s + (v - coef[0] - coef[1] * x[i]) ** 2, 0);
    const sst = y.reduce((s, v) => s + (v - my) ** 2, 0);
    expect(r.rSquared).toBeCloseTo(1 - sse / sst, 9);
    expect(r.rSquared).toBeLessThan(1);
  });

  it('common practice, no source: PTFE-like angles (water 110°, diiodomethane 80°) give about 18–22 mN/m', () => {
    // These exact angles give 17.9 mN/m, at the low edge of "about 18–22"; water 108° with
    // diiodomethane 78° (also PTFE-like) gives 19.0.
    const a = owrk([
      { liquid: water, angleDeg: 110 },
      { liquid: diiodomethane, angleDeg: 80 },
    ]);
    expect(a.gammaTotal).toBeGreaterThan(17.5);
    expect(a.gammaTotal).toBeLessThan(22);
    expect(a.gammaPolar).toBeLessThan(1);
    const b = owrk([
      { liquid: water, angleDeg: 108 },
      { liquid: diiodomethane, angleDeg: 78 },
    ]);
    expect(b.gammaTotal).toBeGreaterThan(18);
    expect(b.gammaTotal).toBeLessThan(22);
  });

  it('common practice, no source: PP-like angles (water 102°, diiodomethane 55°) give about 29–33 mN/m', () => {
    const r = owrk([
      { liquid: water, angleDeg: 102 },
      { liquid: diiodomethane, angleDeg: 55 },
    ]);
    expect(r.gammaTotal).toBeGreaterThan(29);
    expect(r.gammaTotal).toBeLessThan(33);
  });

  it('bad input throws SurfaceEnergyInputError with what to do', () => {
    expect(() => owrk([{ liquid: water, angleDeg: 90 }])).toThrow(/at least 2/);
    expect(() =>
      owrk([
        { liquid: water, angleDeg: Number.NaN },
        { liquid: diiodomethane, angleDeg: 50 },
      ]),
    ).toThrow(SurfaceEnergyInputError);
    expect(() =>
      owrk([
        { liquid: water, angleDeg: 190 },
        { liquid: diiodomethane, angleDeg: 50 },
      ]),
    ).toThrow(/outside 0–180°/);
    expect(() =>
      owrk([
        { liquid: { ...water, gammaPolar: -51, gammaTotal: -29.2 }, angleDeg: 90 },
        { liquid: diiodomethane, angleDeg: 50 },
      ]),
    ).toThrow(/must be positive|zero or positive/);
    // Collinear in x: water twice cannot separate the components.
    expect(() =>
      owrk([
        { liquid: water, angleDeg: 90 },
        { liquid: water, angleDeg: 92 },
      ]),
    ).toThrow(/different polarity/);
    expect(() =>
      owrk([
        { liquid: { ...water, gammaTotal: 80 }, angleDeg: 90 },
        { liquid: diiodomethane, angleDeg: 50 },
      ]),
    ).toThrow(/should equal the total/);
  });
});

describe('Wu harmonic mean (Wu 1971)', () => {
  it('recovers an assumed solid (γSd 30, γSp 12) from water + diiodomethane angles forward-computed in the test', () => {
    const ms = [water, diiodomethane].map((liquid) => ({
      liquid,
      angleDeg: wuAngle(30, 12, liquid),
    }));
    const r = wu(ms);
    expect(r.gammaDispersive).toBeCloseTo(30, 8);
    expect(r.gammaPolar).toBeCloseTo(12, 8);
  });

  it('agrees with the closed form available when one liquid is apolar', () => {
    // Diiodomethane (γLp = 0): k = γL(1 + cos θ) = 4γSd γLd/(γSd + γLd) ⇒ γSd = k γLd/(4γLd − k).
    // Water then gives 4γSp γLp/(γSp + γLp) = kW − 4γSd γLd/(γSd+γLd) ⇒ γSp = hγLp/(4γLp − h).
    const angW = 84;
    const angD = 46;
    const kD = diiodomethane.gammaTotal * (1 + Math.cos(rad(angD)));
    const sd = (kD * diiodomethane.gammaDispersive) / (4 * diiodomethane.gammaDispersive - kD);
    const kW = water.gammaTotal * (1 + Math.cos(rad(angW)));
    const h = kW - (4 * sd * water.gammaDispersive) / (sd + water.gammaDispersive);
    const sp = (h * water.gammaPolar) / (4 * water.gammaPolar - h);
    const r = wu([
      { liquid: water, angleDeg: angW },
      { liquid: diiodomethane, angleDeg: angD },
    ]);
    expect(r.gammaDispersive).toBeCloseTo(sd, 8);
    expect(r.gammaPolar).toBeCloseTo(sp, 8);
  });

  it('two polar liquids (water + ethylene glycol): the solution satisfies both harmonic-mean equations', () => {
    const ms = [water, ethyleneGlycol].map((liquid) => ({
      liquid,
      angleDeg: wuAngle(35, 8, liquid),
    }));
    const r = wu(ms);
    for (const m of ms)
      expect(wuAngle(r.gammaDispersive, r.gammaPolar, m.liquid)).toBeCloseTo(m.angleDeg, 6);
    const all = [
      { gammaDispersive: r.gammaDispersive, gammaPolar: r.gammaPolar },
      ...r.otherSolutions,
    ];
    expect(
      all.some((s) => Math.abs(s.gammaDispersive - 35) < 1e-6 && Math.abs(s.gammaPolar - 8) < 1e-6),
    ).toBe(true);
  });

  it('needs exactly two liquids of different polarity', () => {
    expect(() => wu(STROM.slice(0, 3).map((liquid) => ({ liquid, angleDeg: 60 })))).toThrow(
      /exactly two/,
    );
    expect(() =>
      wu([
        { liquid: diiodomethane, angleDeg: 60 },
        { liquid: { ...diiodomethane, name: 'Other apolar' }, angleDeg: 50 },
      ]),
    ).toThrow(SurfaceEnergyInputError);
  });
});

describe('Fowkes dispersive-only (Fowkes 1964)', () => {
  it('diiodomethane at 80°: γSd = γL(1 + cos θ)²/4 (hand formula, apolar liquid)', () => {
    const expected = (50.8 * (1 + Math.cos(rad(80))) ** 2) / 4;
    expect(fowkes({ liquid: diiodomethane, angleDeg: 80 }).gammaDispersive).toBeCloseTo(
      expected,
      10,
    );
    expect(expected).toBeCloseTo(17.49, 2);
  });
  it('refuses a polar liquid', () => {
    expect(() => fowkes({ liquid: water, angleDeg: 80 })).toThrow(/apolar/);
  });
});

describe('Zisman critical surface tension (Zisman 1964)', () => {
  it('recovers γc from angles on an exact line cos θ = 1 − 0.03(γL − 22)', () => {
    const ms = [diiodomethane, ethyleneGlycol, formamide, glycerol, water].map((liquid) => ({
      liquid,
      angleDeg: deg(Math.acos(1 - 0.03 * (liquid.gammaTotal - 22))),
    }));
    const r = zisman(ms);
    expect(r.criticalSurfaceTension).toBeCloseTo(22, 9);
    expect(r.slope).toBeCloseTo(-0.03, 12);
    expect(r.rSquared).toBeCloseTo(1, 12);
  });
  it('rejects a rising line and equal tensions', () => {
    expect(() =>
      zisman([
        { liquid: diiodomethane, angleDeg: 80 },
        { liquid: water, angleDeg: 40 },
      ]),
    ).toThrow(/does not fall/);
    expect(() =>
      zisman([
        { liquid: water, angleDeg: 80 },
        { liquid: water, angleDeg: 82 },
      ]),
    ).toThrow(SurfaceEnergyInputError);
  });
});

describe('Neumann equation of state (Kwok & Neumann 1999)', () => {
  it('inverts the equation of state written out in the test', () => {
    const beta = 0.0001247; // Kwok & Neumann 1999 (from memory)
    for (const gs of [15, 25, 40]) {
      const cos = -1 + 2 * Math.sqrt(gs / 72.8) * Math.exp(-beta * (72.8 - gs) ** 2);
      expect(neumann({ liquid: water, angleDeg: deg(Math.acos(cos)) }).gammaSolid).toBeCloseTo(
        gs,
        9,
      );
    }
    expect(neumannCosTheta(20, 50.8)).toBeCloseTo(
      -1 + 2 * Math.sqrt(20 / 50.8) * Math.exp(-beta * 30.8 ** 2),
      14,
    );
  });
  it('θ = 0 gives γS = γL; larger angles give lower γS', () => {
    expect(neumann({ liquid: water, angleDeg: 0 }).gammaSolid).toBeCloseTo(72.8, 9);
    expect(neumann({ liquid: water, angleDeg: 110 }).gammaSolid).toBeLessThan(
      neumann({ liquid: water, angleDeg: 90 }).gammaSolid,
    );
  });
  it('rejects a non-positive liquid tension', () => {
    expect(() => neumann({ liquid: { ...water, gammaTotal: 0 }, angleDeg: 90 })).toThrow(
      SurfaceEnergyInputError,
    );
  });
});

describe('van Oss–Chaudhury–Good acid–base (1988)', () => {
  it('recovers an assumed solid (γLW 38, γ+ 0.5, γ− 15) from water, diiodomethane, formamide', () => {
    const ms = [water, diiodomethane, formamide].map((liquid) => ({
      liquid,
      angleDeg: acidBaseAngle(38, 0.5, 15, liquid),
    }));
    const r = acidBase(ms);
    expect(r.gammaLW).toBeCloseTo(38, 8);
    expect(r.gammaPlus).toBeCloseTo(0.5, 8);
    expect(r.gammaMinus).toBeCloseTo(15, 8);
    expect(r.gammaTotal).toBeCloseTo(38 + 2 * Math.sqrt(7.5), 8);
  });

  it('agrees with an independent 3×3 solve by Cramer’s rule for measured-looking angles', () => {
    const ms = [
      { liquid: water, angleDeg: 78 },
      { liquid: diiodomethane, angleDeg: 42 },
      { liquid: glycerol, angleDeg: 70 },
    ];
    const A = ms.map((m) => [
      Math.sqrt(m.liquid.gammaLW as number),
      Math.sqrt(m.liquid.gammaMinus as number),
      Math.sqrt(m.liquid.gammaPlus as number),
    ]);
    const b = ms.map((m) => (m.liquid.gammaTotal * (1 + Math.cos(rad(m.angleDeg)))) / 2);
    const det3 = (M: number[][]) =>
      M[0][0] * (M[1][1] * M[2][2] - M[1][2] * M[2][1]) -
      M[0][1] * (M[1][0] * M[2][2] - M[1][2] * M[2][0]) +
      M[0][2] * (M[1][0] * M[2][1] - M[1][1] * M[2][0]);
    const D = det3(A);
    const col = (j: number) => det3(A.map((row, i) => row.map((v, k) => (k === j ? b[i] : v)))) / D;
    const [x0, x1, x2] = [col(0), col(1), col(2)];
    expect(Math.min(x0, x1, x2)).toBeGreaterThan(0);
    const r = acidBase(ms);
    expect(r.gammaLW).toBeCloseTo(x0 * x0, 8);
    expect(r.gammaPlus).toBeCloseTo(x1 * x1, 8);
    expect(r.gammaMinus).toBeCloseTo(x2 * x2, 8);
    expect(r.maxResidual).toBeLessThan(1e-9);
  });

  it('five liquids: least squares still recovers an exact solid', () => {
    const ms = STROM.map((liquid) => ({ liquid, angleDeg: acidBaseAngle(32, 0.3, 8, liquid) }));
    const r = acidBase(ms);
    expect(r.gammaLW).toBeCloseTo(32, 7);
    expect(r.gammaPlus).toBeCloseTo(0.3, 7);
    expect(r.gammaMinus).toBeCloseTo(8, 7);
  });

  it('rejects too few liquids, missing components and a degenerate set', () => {
    expect(() =>
      acidBase([
        { liquid: water, angleDeg: 80 },
        { liquid: diiodomethane, angleDeg: 40 },
      ]),
    ).toThrow(/at least 3/);
    expect(() =>
      acidBase([
        { liquid: water, angleDeg: 80 },
        { liquid: diiodomethane, angleDeg: 40 },
        { liquid: { ...formamide, gammaPlus: undefined }, angleDeg: 60 },
      ]),
    ).toThrow(/acid component/);
    expect(() =>
      acidBase([
        { liquid: diiodomethane, angleDeg: 40 },
        { liquid: { ...diiodomethane, name: 'Apolar B' }, angleDeg: 41 },
        { liquid: water, angleDeg: 80 },
      ]),
    ).toThrow(/cannot separate/);
  });
});
