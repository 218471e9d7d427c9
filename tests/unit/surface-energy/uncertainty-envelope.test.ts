import { describe, expect, it } from 'vitest';
import {
  PROBE_LIQUIDS,
  predictAngleOwrk,
  propagateAngleUncertainty,
  SurfaceEnergyInputError,
  surfaceEnergyWithUncertainty,
  wettingEnvelope,
  type AngleMeasurement,
} from '@/lib/surface-energy';

const { water, diiodomethane, formamide } = PROBE_LIQUIDS;
const rad = (d: number) => (d * Math.PI) / 180;

function pair(sd: number): AngleMeasurement[] {
  return [
    { liquid: water, angleDeg: 72, angleSdDeg: sd },
    { liquid: diiodomethane, angleDeg: 44, angleSdDeg: sd },
  ];
}

describe('uncertainty propagated from the angles’ spread', () => {
  it('Monte Carlo is reproducible with a seed and changes with another seed', () => {
    const a = surfaceEnergyWithUncertainty('owrk', pair(2), { seed: 7, draws: 500 });
    const b = surfaceEnergyWithUncertainty('owrk', pair(2), { seed: 7, draws: 500 });
    const c = surfaceEnergyWithUncertainty('owrk', pair(2), { seed: 8, draws: 500 });
    expect(b).toEqual(a);
    expect(c.components.gammaTotal.standardUncertainty).not.toBe(
      a.components.gammaTotal.standardUncertainty,
    );
    expect(a.seed).toBe('7');
  });

  it('uncertainty shrinks as the angle SD shrinks (Monte Carlo and linear)', () => {
    for (const propagation of ['monte-carlo', 'linear'] as const) {
      const wide = surfaceEnergyWithUncertainty('owrk', pair(3), {
        propagation,
        seed: 1,
        draws: 1000,
      });
      const narrow = surfaceEnergyWithUncertainty('owrk', pair(0.5), {
        propagation,
        seed: 1,
        draws: 1000,
      });
      for (const k of ['gammaDispersive', 'gammaPolar', 'gammaTotal'] as const) {
        expect(narrow.components[k].standardUncertainty).toBeLessThan(
          wide.components[k].standardUncertainty / 3,
        );
      }
    }
    const zero = surfaceEnergyWithUncertainty('owrk', pair(0), { seed: 1, draws: 50 });
    expect(zero.components.gammaTotal.standardUncertainty).toBe(0);
  });

  it('linear propagation matches the analytic derivative of the Fowkes formula', () => {
    // γSd = γL(1 + cos θ)²/4 ⇒ dγSd/dθ = −γL(1 + cos θ) sin θ / 2 (per radian); u = |d|·u(θ).
    const theta = 50;
    const sd = 1.5;
    const r = surfaceEnergyWithUncertainty(
      'fowkes',
      [{ liquid: diiodomethane, angleDeg: theta, angleSdDeg: sd }],
      {
        propagation: 'linear',
      },
    );
    const analytic = ((50.8 * (1 + Math.cos(rad(theta))) * Math.sin(rad(theta))) / 2) * rad(sd);
    expect(r.components.gammaDispersive.standardUncertainty).toBeCloseTo(analytic, 5);
  });

  it('Monte Carlo and linear propagation agree within 10 % for a small spread (Wu, acid–base)', () => {
    const ab: AngleMeasurement[] = [
      { liquid: water, angleDeg: 80, angleSdDeg: 1 },
      { liquid: diiodomethane, angleDeg: 45, angleSdDeg: 1 },
      { liquid: formamide, angleDeg: 62, angleSdDeg: 1 },
    ];
    const mc = surfaceEnergyWithUncertainty('acid-base', ab, { seed: 3, draws: 3000 });
    const lin = surfaceEnergyWithUncertainty('acid-base', ab, { propagation: 'linear' });
    expect(
      mc.components.gammaLW.standardUncertainty / lin.components.gammaLW.standardUncertainty,
    ).toBeCloseTo(1, 1);
    const mcWu = surfaceEnergyWithUncertainty('wu', pair(1), { seed: 3, draws: 1000 });
    const linWu = surfaceEnergyWithUncertainty('wu', pair(1), { propagation: 'linear' });
    expect(
      mcWu.components.gammaTotal.standardUncertainty /
        linWu.components.gammaTotal.standardUncertainty,
    ).toBeCloseTo(1, 1);
  });

  it('reports the value of the measured angles themselves, with every component', () => {
    const r = surfaceEnergyWithUncertainty(
      'neumann',
      [{ liquid: water, angleDeg: 95, angleSdDeg: 2 }],
      { seed: 'x', draws: 200 },
    );
    expect(Object.keys(r.components)).toEqual(['gammaSolid']);
    const custom = propagateAngleUncertainty(
      pair(1),
      (ms) => ({ cosWater: Math.cos(rad(ms[0].angleDeg)) }),
      {
        propagation: 'linear',
      },
    );
    expect(custom.components.cosWater.value).toBeCloseTo(Math.cos(rad(72)), 14);
    expect(custom.components.cosWater.standardUncertainty).toBeCloseTo(
      Math.sin(rad(72)) * rad(1),
      8,
    );
  });

  it('rejects a negative spread and too few draws', () => {
    expect(() => surfaceEnergyWithUncertainty('owrk', pair(-1))).toThrow(SurfaceEnergyInputError);
    expect(() => surfaceEnergyWithUncertainty('owrk', pair(1), { draws: 3 })).toThrow(
      /at least 10/,
    );
  });
});

describe('wetting envelope (OWRK geometric mean)', () => {
  const solid = { gammaDispersive: 30, gammaPolar: 10 };

  it('every curve point is a liquid that would show exactly the chosen angle (forward check in the test)', () => {
    for (const angleDeg of [0, 30, 60]) {
      const env = wettingEnvelope(solid, { angleDeg, steps: 30 });
      for (const p of env.points.slice(2, -2)) {
        const gl = p.gammaDispersive + p.gammaPolar;
        const cos =
          (2 * (Math.sqrt(30 * p.gammaDispersive) + Math.sqrt(10 * p.gammaPolar))) / gl - 1;
        expect(cos).toBeCloseTo(Math.cos(rad(angleDeg)), 9);
        expect(predictAngleOwrk(solid, { name: 'probe', gammaTotal: gl, ...p })).toBeCloseTo(
          angleDeg,
          5,
        );
      }
    }
  });

  it('is closed at the origin and meets the axes at 4γS/(1 + cos θ)²', () => {
    const env = wettingEnvelope(solid, { angleDeg: 60, steps: 10 });
    expect(env.points[0]).toEqual({ gammaDispersive: 0, gammaPolar: 0 });
    expect(env.points[env.points.length - 1]).toEqual({ gammaDispersive: 0, gammaPolar: 0 });
    expect(env.points[1].gammaDispersive).toBeCloseTo((4 * 30) / 1.5 ** 2, 10);
    expect(env.points[env.points.length - 2].gammaPolar).toBeCloseTo((4 * 10) / 1.5 ** 2, 10);
  });

  it('rejects 180° and negative components', () => {
    expect(() => wettingEnvelope(solid, { angleDeg: 180 })).toThrow(SurfaceEnergyInputError);
    expect(() => wettingEnvelope({ gammaDispersive: -1, gammaPolar: 3 })).toThrow(
      /zero or positive/,
    );
  });
});
