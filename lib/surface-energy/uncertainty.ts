import seedrandom from 'seedrandom';
import { SurfaceEnergyInputError } from './errors';
import type { AngleMeasurement } from './types';
import { owrk } from './owrk';
import { wu } from './wu';
import { fowkes } from './fowkes';
import { zisman } from './zisman';
import { neumann } from './neumann';
import { acidBase } from './acid-base';
import { assertMeasurements } from './validate';

/** A result component with its standard uncertainty (one standard deviation), same unit. */
export interface ValueWithUncertainty {
  value: number;
  standardUncertainty: number;
}

export type Propagation = 'monte-carlo' | 'linear';

export interface PropagationOptions {
  /** 'monte-carlo' (default; JCGM 101:2008 style) or 'linear' (first-order law of propagation, JCGM 100:2008). */
  propagation?: Propagation;
  /** Monte Carlo draws (default 2000). */
  draws?: number;
  /** Seed of the pseudo-random generator (default 'beadline'); the same seed gives the same result. */
  seed?: string | number;
}

export interface UncertaintyResult<K extends string> {
  propagation: Propagation;
  components: Record<K, ValueWithUncertainty>;
  /** Monte Carlo only: draws made, draws the method could not solve, and the seed. */
  draws: number | null;
  failedDraws: number | null;
  seed: string | null;
  warnings: string[];
}

type Compute<K extends string> = (measurements: AngleMeasurement[]) => Record<K, number>;

/** Standard normal deviates from a seeded uniform generator (Box–Muller). */
function normalGenerator(seed: string): () => number {
  const uniform = seedrandom(seed);
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    let u = 0;
    while (u === 0) u = uniform();
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
}

function sdOf(m: AngleMeasurement): number {
  const sd = m.angleSdDeg ?? 0;
  if (!Number.isFinite(sd) || sd < 0) {
    throw new SurfaceEnergyInputError(
      'bad-uncertainty',
      `Liquid "${m.liquid.name}": the angle spread is ${String(sd)}; enter a standard deviation of zero or more degrees.`,
    );
  }
  return sd;
}

/**
 * Propagate the spread of the contact angles (each measurement's `angleSdDeg`) to every
 * numeric output of `compute`. Monte Carlo draws each angle from a normal distribution
 * (redrawn if it falls outside 0–180°) with a seeded generator, so results repeat for the same
 * seed; the linear option uses central differences (0.01°) and adds contributions in quadrature.
 * The reported value is always that of the measured angles themselves.
 */
export function propagateAngleUncertainty<K extends string>(
  measurements: readonly AngleMeasurement[],
  compute: Compute<K>,
  options: PropagationOptions = {},
): UncertaintyResult<K> {
  const sds = measurements.map(sdOf);
  const base = [...measurements];
  const nominal = compute(base);
  const keys = Object.keys(nominal) as K[];
  const warnings: string[] = [];
  if (sds.every((s) => s === 0))
    warnings.push('No angle spread was given, so every uncertainty is zero.');
  const propagation = options.propagation ?? 'monte-carlo';

  if (propagation === 'linear') {
    const h = 0.01;
    const variance = Object.fromEntries(keys.map((k) => [k, 0])) as Record<K, number>;
    measurements.forEach((m, i) => {
      if (sds[i] === 0) return;
      const up = Math.min(180, m.angleDeg + h);
      const down = Math.max(0, m.angleDeg - h);
      const at = (angle: number) =>
        compute(base.map((b, j) => (j === i ? { ...b, angleDeg: angle } : b)));
      const fUp = at(up);
      const fDown = at(down);
      for (const k of keys) {
        const derivative = (fUp[k] - fDown[k]) / (up - down);
        variance[k] += (derivative * sds[i]) ** 2;
      }
    });
    const components = Object.fromEntries(
      keys.map((k) => [k, { value: nominal[k], standardUncertainty: Math.sqrt(variance[k]) }]),
    ) as Record<K, ValueWithUncertainty>;
    return { propagation, components, draws: null, failedDraws: null, seed: null, warnings };
  }

  const draws = options.draws ?? 2000;
  if (!Number.isInteger(draws) || draws < 10) {
    throw new SurfaceEnergyInputError(
      'bad-parameter',
      `Monte Carlo needs a whole number of at least 10 draws, got ${String(draws)}.`,
    );
  }
  const seed = String(options.seed ?? 'beadline');
  const normal = normalGenerator(seed);
  // Welford running mean and variance per component.
  const count = Object.fromEntries(keys.map((k) => [k, 0])) as Record<K, number>;
  const runMean = Object.fromEntries(keys.map((k) => [k, 0])) as Record<K, number>;
  const m2 = Object.fromEntries(keys.map((k) => [k, 0])) as Record<K, number>;
  let failedDraws = 0;
  for (let d = 0; d < draws; d++) {
    const drawn = base.map((m, i) => {
      if (sds[i] === 0) return m;
      let angle = m.angleDeg + sds[i] * normal();
      for (let tries = 0; (angle < 0 || angle > 180) && tries < 50; tries++)
        angle = m.angleDeg + sds[i] * normal();
      return { ...m, angleDeg: Math.min(180, Math.max(0, angle)) };
    });
    let out: Record<K, number>;
    try {
      out = compute(drawn);
    } catch (e) {
      if (e instanceof SurfaceEnergyInputError) {
        failedDraws++;
        continue;
      }
      throw e;
    }
    for (const k of keys) {
      const x = out[k];
      if (!Number.isFinite(x)) continue;
      count[k]++;
      const delta = x - runMean[k];
      runMean[k] += delta / count[k];
      m2[k] += delta * (x - runMean[k]);
    }
  }
  if (failedDraws > draws / 2) {
    throw new SurfaceEnergyInputError(
      'unstable',
      `The method could not be solved for ${failedDraws} of ${draws} drawn angle sets; the angles' spread is too large for this liquid set. Reduce the spread or use another method.`,
    );
  }
  if (failedDraws > 0)
    warnings.push(
      `${failedDraws} of ${draws} drawn angle sets could not be solved and were left out.`,
    );
  const components = Object.fromEntries(
    keys.map((k) => [
      k,
      {
        value: nominal[k],
        standardUncertainty: count[k] > 1 ? Math.sqrt(m2[k] / (count[k] - 1)) : 0,
      },
    ]),
  ) as Record<K, ValueWithUncertainty>;
  return { propagation, components, draws, failedDraws, seed, warnings };
}

function single(ms: AngleMeasurement[], method: string): AngleMeasurement {
  if (ms.length !== 1) {
    throw new SurfaceEnergyInputError(
      'wrong-liquid-count',
      `${method} uses one liquid (got ${ms.length}); pass only that liquid's measurement.`,
    );
  }
  return ms[0];
}

/** The published methods by key, each reduced to its numeric components. */
export const SURFACE_ENERGY_METHODS = {
  owrk: (ms: AngleMeasurement[]) => {
    const r = owrk(ms);
    return {
      gammaDispersive: r.gammaDispersive,
      gammaPolar: r.gammaPolar,
      gammaTotal: r.gammaTotal,
    };
  },
  wu: (ms: AngleMeasurement[]) => {
    const r = wu(ms);
    return {
      gammaDispersive: r.gammaDispersive,
      gammaPolar: r.gammaPolar,
      gammaTotal: r.gammaTotal,
    };
  },
  fowkes: (ms: AngleMeasurement[]) => ({
    gammaDispersive: fowkes(single(ms, 'Fowkes')).gammaDispersive,
  }),
  zisman: (ms: AngleMeasurement[]) => ({
    criticalSurfaceTension: zisman(ms).criticalSurfaceTension,
  }),
  neumann: (ms: AngleMeasurement[]) => ({
    gammaSolid: neumann(single(ms, 'The Neumann equation of state')).gammaSolid,
  }),
  'acid-base': (ms: AngleMeasurement[]) => {
    const r = acidBase(ms);
    return {
      gammaLW: r.gammaLW,
      gammaPlus: r.gammaPlus,
      gammaMinus: r.gammaMinus,
      gammaAB: r.gammaAB,
      gammaTotal: r.gammaTotal,
    };
  },
} as const;

export type SurfaceEnergyMethod = keyof typeof SURFACE_ENERGY_METHODS;
export type MethodComponent<M extends SurfaceEnergyMethod> = keyof ReturnType<
  (typeof SURFACE_ENERGY_METHODS)[M]
> &
  string;

/**
 * Compute a surface-energy method and the standard uncertainty of each of its components from
 * the angles' spread, e.g. `surfaceEnergyWithUncertainty('owrk', measurements, { seed: 42 })`.
 */
export function surfaceEnergyWithUncertainty<M extends SurfaceEnergyMethod>(
  method: M,
  measurements: readonly AngleMeasurement[],
  options: PropagationOptions = {},
): UncertaintyResult<MethodComponent<M>> & { method: M } {
  const compute = SURFACE_ENERGY_METHODS[method] as unknown as Compute<MethodComponent<M>>;
  if (!compute) {
    throw new SurfaceEnergyInputError(
      'unknown-method',
      `Unknown surface-energy method "${String(method)}".`,
    );
  }
  assertMeasurements(measurements, 1, 'Uncertainty propagation');
  return { method, ...propagateAngleUncertainty(measurements, compute, options) };
}
