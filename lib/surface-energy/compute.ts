import {
  owrk,
  wettingEnvelope,
  surfaceEnergyWithUncertainty,
  SurfaceEnergyInputError,
  type AngleMeasurement,
  type LiquidComponents,
  type SurfaceEnergyMethod,
  type ValueWithUncertainty,
} from './index';

/*
 * The one place that decides which methods a liquid set allows and runs them with their
 * uncertainty: the surface-energy page, its route handlers and a saved result's recomputation all
 * call computeSurfaceEnergy.
 */

export const SURFACE_ENERGY_METHOD_KEYS = [
  'owrk',
  'wu',
  'fowkes',
  'zisman',
  'neumann',
  'acid-base',
] as const satisfies readonly SurfaceEnergyMethod[];

/** The published name of each method; kept with every computed result. */
export const SURFACE_ENERGY_METHOD_NAMES: Record<SurfaceEnergyMethod, string> = {
  owrk: 'OWRK (Owens–Wendt–Rabel–Kaelble)',
  wu: 'Wu harmonic mean',
  fowkes: 'Fowkes (dispersive only)',
  zisman: 'Zisman critical surface tension',
  neumann: 'Neumann equation of state',
  'acid-base': 'van Oss–Chaudhury–Good acid–base',
};

/**
 * What the uncertainty describes: 'mean' propagates the standard error of each mean angle
 * (SD/√n, the uncertainty of the sample's value); 'single' propagates the SD itself (the spread
 * of results from single drops).
 */
export const UNCERTAINTY_BASES = ['mean', 'single'] as const;
export type UncertaintyBasis = (typeof UNCERTAINTY_BASES)[number];

/** One probe liquid with its components (mN/m), the mean angle measured with it, SD and n. */
export type LiquidAngle = LiquidComponents & {
  probeLiquidId?: string;
  angleDeg: number;
  angleSdDeg?: number;
  n?: number;
};

/** The choices of a computation: which methods, what the uncertainty describes, the envelope. */
export type SurfaceEnergyOptions = {
  methods: SurfaceEnergyMethod[];
  uncertaintyBasis: UncertaintyBasis;
  /** Contact angle of the wetting envelope, degrees (0 = the liquids that spread completely). */
  envelopeAngleDeg: number;
};

// ---------------------------------------------------------------------------------------------
// Which methods a liquid set allows
// ---------------------------------------------------------------------------------------------

const hasAcidBase = (l: LiquidAngle) =>
  l.gammaLW !== undefined && l.gammaPlus !== undefined && l.gammaMinus !== undefined;
const isApolar = (l: LiquidAngle) => l.gammaPolar <= 0.5 && l.gammaDispersive > 0;

export type MethodAvailability = {
  method: SurfaceEnergyMethod;
  available: boolean;
  reason: string | null;
};

/** For each method: can it run on these liquids, and if not, why (in words for the page). */
export function methodAvailability(liquids: readonly LiquidAngle[]): MethodAvailability[] {
  const split = liquids.filter((l) => l.gammaDispersive > 0);
  const ratios = new Set(split.map((l) => (l.gammaPolar / l.gammaDispersive).toFixed(3)));
  const acidBaseLiquids = liquids.filter(hasAcidBase);
  const polarAcidBase = acidBaseLiquids.filter((l) => (l.gammaPlus ?? 0) + (l.gammaMinus ?? 0) > 0);
  const tensions = new Set(liquids.map((l) => l.gammaTotal.toFixed(2)));
  const check = (method: SurfaceEnergyMethod, reason: string | null): MethodAvailability => ({
    method,
    available: reason === null,
    reason,
  });
  return [
    check(
      'owrk',
      split.length < 2
        ? 'OWRK needs at least two liquids with known dispersive and polar components.'
        : ratios.size < 2
          ? 'OWRK needs liquids of different polarity, e.g. water with diiodomethane.'
          : null,
    ),
    check(
      'wu',
      split.length !== 2 || liquids.length !== 2 || ratios.size < 2
        ? `Wu's harmonic mean takes exactly two liquids of different polarity (this sample has ${liquids.length}).`
        : null,
    ),
    check(
      'fowkes',
      liquids.some(isApolar)
        ? null
        : 'Fowkes needs an apolar liquid (polar component 0), such as diiodomethane.',
    ),
    check(
      'zisman',
      liquids.length < 2 || tensions.size < 2
        ? 'Zisman needs at least two liquids of different surface tension (three or more recommended).'
        : null,
    ),
    check('neumann', liquids.length < 1 ? 'The Neumann equation of state needs one liquid.' : null),
    check(
      'acid-base',
      acidBaseLiquids.length < 3
        ? `The van Oss–Chaudhury–Good method needs three liquids with known γLW, γ+ and γ− (this sample has ${acidBaseLiquids.length}); add e.g. formamide or ethylene glycol to water and diiodomethane.`
        : polarAcidBase.length < 2
          ? 'The van Oss–Chaudhury–Good method needs two polar liquids with different acid/base balance, e.g. water and formamide.'
          : null,
    ),
  ];
}

// ---------------------------------------------------------------------------------------------
// Running the methods
// ---------------------------------------------------------------------------------------------

export type MethodOutcome = {
  method: SurfaceEnergyMethod;
  label: string;
  /** Names of the liquids this result was computed from. */
  liquidsUsed: string[];
  status: 'ok' | 'unavailable' | 'failed';
  /** Why the method was not run or failed. */
  reason: string | null;
  components: Record<string, ValueWithUncertainty>;
  warnings: string[];
};

export type OwrkPlot = {
  points: { liquid: string; x: number; y: number; fittedY: number }[];
  slope: number;
  intercept: number;
  rSquared: number;
};

export type EnvelopePlot = {
  angleDeg: number;
  points: { gammaDispersive: number; gammaPolar: number }[];
  liquids: { name: string; gammaDispersive: number; gammaPolar: number }[];
};

export type SurfaceEnergyOutputs = {
  uncertainty: {
    basis: UncertaintyBasis;
    propagation: 'monte-carlo';
    draws: number;
    seed: string;
    note: string;
  };
  results: MethodOutcome[];
  owrkPlot: OwrkPlot | null;
  envelope: EnvelopePlot | null;
};

const DRAWS = 2000;
const SEED = 'beadline';

function toMeasurement(liquid: LiquidAngle, basis: UncertaintyBasis): AngleMeasurement {
  const sd = liquid.angleSdDeg ?? 0;
  const spread = basis === 'mean' && liquid.n && liquid.n > 1 ? sd / Math.sqrt(liquid.n) : sd;
  return {
    liquid: {
      name: liquid.name,
      gammaTotal: liquid.gammaTotal,
      gammaDispersive: liquid.gammaDispersive,
      gammaPolar: liquid.gammaPolar,
      gammaLW: liquid.gammaLW,
      gammaPlus: liquid.gammaPlus,
      gammaMinus: liquid.gammaMinus,
    },
    angleDeg: liquid.angleDeg,
    angleSdDeg: spread,
  };
}

function run(
  method: SurfaceEnergyMethod,
  used: readonly LiquidAngle[],
  basis: UncertaintyBasis,
): MethodOutcome {
  const base = {
    method,
    label: SURFACE_ENERGY_METHOD_NAMES[method],
    liquidsUsed: used.map((l) => l.name),
  };
  try {
    const result = surfaceEnergyWithUncertainty(
      method,
      used.map((l) => toMeasurement(l, basis)),
      { draws: DRAWS, seed: SEED },
    );
    return {
      ...base,
      status: 'ok',
      reason: null,
      components: result.components as Record<string, ValueWithUncertainty>,
      warnings: result.warnings,
    };
  } catch (error) {
    if (error instanceof SurfaceEnergyInputError)
      return { ...base, status: 'failed', reason: error.message, components: {}, warnings: [] };
    throw error;
  }
}

/**
 * Runs the chosen methods on the liquids' mean angles, each with the standard uncertainty of
 * its components propagated from the angles' spread (Monte Carlo, seeded, so a saved result
 * can be recomputed exactly). Fowkes uses the most apolar liquid; Neumann runs once per liquid.
 */
export function computeSurfaceEnergy(
  liquids: readonly LiquidAngle[],
  options: SurfaceEnergyOptions,
): SurfaceEnergyOutputs {
  const availability = new Map(methodAvailability(liquids).map((a) => [a.method, a]));
  const results: MethodOutcome[] = [];
  for (const method of options.methods) {
    const check = availability.get(method);
    if (!check?.available) {
      results.push({
        method,
        label: SURFACE_ENERGY_METHOD_NAMES[method],
        liquidsUsed: [],
        status: 'unavailable',
        reason: check?.reason ?? 'Not available for these liquids.',
        components: {},
        warnings: [],
      });
      continue;
    }
    if (method === 'owrk')
      results.push(
        run(
          method,
          liquids.filter((l) => l.gammaDispersive > 0),
          options.uncertaintyBasis,
        ),
      );
    else if (method === 'fowkes') {
      const apolar = [...liquids].filter(isApolar).sort((a, b) => a.gammaPolar - b.gammaPolar)[0];
      results.push(run(method, [apolar], options.uncertaintyBasis));
    } else if (method === 'neumann') {
      for (const liquid of liquids) results.push(run(method, [liquid], options.uncertaintyBasis));
    } else if (method === 'acid-base')
      results.push(run(method, liquids.filter(hasAcidBase), options.uncertaintyBasis));
    else results.push(run(method, liquids, options.uncertaintyBasis));
  }

  let owrkPlot: OwrkPlot | null = null;
  let envelope: EnvelopePlot | null = null;
  if (availability.get('owrk')?.available) {
    try {
      const fit = owrk(
        liquids.filter((l) => l.gammaDispersive > 0).map((l) => toMeasurement(l, 'single')),
      );
      owrkPlot = {
        points: fit.points,
        slope: fit.slope,
        intercept: fit.intercept,
        rSquared: fit.rSquared,
      };
      envelope = {
        ...wettingEnvelope(
          { gammaDispersive: fit.gammaDispersive, gammaPolar: fit.gammaPolar },
          { angleDeg: options.envelopeAngleDeg, steps: 90 },
        ),
        liquids: liquids.map((l) => ({
          name: l.name,
          gammaDispersive: l.gammaDispersive,
          gammaPolar: l.gammaPolar,
        })),
      };
    } catch (error) {
      if (!(error instanceof SurfaceEnergyInputError)) throw error;
    }
  }

  return {
    uncertainty: {
      basis: options.uncertaintyBasis,
      propagation: 'monte-carlo',
      draws: DRAWS,
      seed: SEED,
      note:
        options.uncertaintyBasis === 'mean'
          ? 'Standard uncertainty propagated from the standard error of each mean angle (SD/√n), Monte Carlo per JCGM 101:2008.'
          : 'Standard uncertainty propagated from the SD of single drops, Monte Carlo per JCGM 101:2008.',
    },
    results,
    owrkPlot,
    envelope,
  };
}

/** The total of a result set for spec checks: OWRK total, else Wu, else acid–base. */
export function headlineTotal(
  outputs: Pick<SurfaceEnergyOutputs, 'results'>,
): MethodOutcome | null {
  for (const method of ['owrk', 'wu', 'acid-base'] as const) {
    const found = outputs.results.find((r) => r.method === method && r.status === 'ok');
    if (found?.components.gammaTotal) return found;
  }
  return null;
}

/** A row of an angle table: one probe liquid measured on a sample or batch (mean, SD, n). */
export type AngleTableLiquid = {
  probeLiquidId: string;
  name: string;
  meanDeg: number;
  sdDeg: number | null;
  n: number;
  gammaTotal: number;
  gammaDispersive: number | null;
  gammaPolar: number | null;
  gammaLW: number | null;
  gammaPlus: number | null;
  gammaMinus: number | null;
};

/**
 * The angle table as calculation input. A lab liquid without a dispersive/polar split carries
 * 0/0, which keeps it out of the split methods (OWRK, Wu, Fowkes); Zisman and Neumann use its
 * total alone.
 */
export function angleTableToLiquids(table: readonly AngleTableLiquid[]): LiquidAngle[] {
  return table.map((row) => ({
    probeLiquidId: row.probeLiquidId,
    name: row.name,
    gammaTotal: row.gammaTotal,
    gammaDispersive: row.gammaDispersive ?? 0,
    gammaPolar: row.gammaPolar ?? 0,
    gammaLW: row.gammaLW ?? undefined,
    gammaPlus: row.gammaPlus ?? undefined,
    gammaMinus: row.gammaMinus ?? undefined,
    angleDeg: row.meanDeg,
    angleSdDeg: row.sdDeg ?? 0,
    n: row.n,
  }));
}
