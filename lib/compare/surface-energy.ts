import { describe } from '@/lib/stats';
import {
  SurfaceEnergyInputError,
  surfaceEnergyWithUncertainty,
  type AngleMeasurement,
  type ValueWithUncertainty,
} from '@/lib/surface-energy';
import type {
  BatchSurfaceEnergy,
  ComparisonBatchInput,
  ComparisonLiquidInput,
  ComparisonSpecInput,
  DropPoint,
  SpecVerdict,
  SurfaceEnergyComparison,
  SurfaceEnergyValue,
} from './types';
import { countsInWindow } from './window';
import { overall } from './outcome';

/*
 * Surface free energy of each batch, judged against the coating's surface-energy limits (e.g.
 * PP-Print ≥ 38 mN/m). OWRK is the method the limits are written in: ISO 19403-2 computes
 * surface free energy from the mean contact angle of each probe liquid with the
 * Owens–Wendt–Rabel–Kaelble geometric mean.
 */

export const SURFACE_ENERGY_METHOD =
  'OWRK (Owens–Wendt–Rabel–Kaelble) over the mean angle of each probe liquid on the batch';
export const SURFACE_ENERGY_BASIS =
  'Each probe liquid with known dispersive and polar components counts with the mean angle of its drops on the batch; the standard uncertainty comes from the standard error of each mean, propagated to first order (JCGM 100:2008). ± figures are expanded uncertainties, k = 2 (about 95 %).';
/** Coverage factor of the expanded uncertainty shown beside each value (about 95 %). */
export const COVERAGE_FACTOR = 2;

type SplitLiquid = ComparisonLiquidInput & {
  gammaTotal: number;
  gammaDispersive: number;
  gammaPolar: number;
};

/** A liquid OWRK can use: a dispersive/polar split with a dispersive part above 0. */
function isSplit(liquid: ComparisonLiquidInput): liquid is SplitLiquid {
  return (
    typeof liquid.gammaTotal === 'number' &&
    typeof liquid.gammaDispersive === 'number' &&
    typeof liquid.gammaPolar === 'number' &&
    liquid.gammaDispersive > 0
  );
}

/** Specs of the coating that set a surface-energy limit. */
export function surfaceEnergySpecs(specs: readonly ComparisonSpecInput[]): ComparisonSpecInput[] {
  return specs.filter(
    (s) => (s.minSurfaceEnergyMnM ?? null) !== null || (s.maxSurfaceEnergyMnM ?? null) !== null,
  );
}

/**
 * OWRK of one batch from the drops that count (those within `maxDays` of treatment when a
 * window is set). Null value with a note when fewer than two liquids of different polarity
 * were measured.
 */
function batchValue(
  drops: readonly DropPoint[],
  liquids: ReadonlyMap<string, SplitLiquid>,
  maxDays: number | null,
): SurfaceEnergyValue {
  const counted = drops.filter(
    (d) => liquids.has(d.probeLiquidId) && countsInWindow(maxDays, d.ageDays),
  );
  const excluded = drops.filter((d) => liquids.has(d.probeLiquidId)).length - counted.length;
  const byLiquid = new Map<string, number[]>();
  for (const d of counted) {
    const angles = byLiquid.get(d.probeLiquidId) ?? [];
    angles.push(d.meanDeg);
    byLiquid.set(d.probeLiquidId, angles);
  }
  const used = [...byLiquid.entries()]
    .map(([id, angles]) => {
      const liquid = liquids.get(id) as SplitLiquid;
      const stats = describe(angles);
      return { liquid, n: stats.n, meanDeg: stats.mean, sdDeg: stats.sd ?? 0 };
    })
    .sort((a, b) => a.liquid.name.localeCompare(b.liquid.name));
  const summary = used.map((u) => ({
    id: u.liquid.id,
    name: u.liquid.name,
    n: u.n,
    meanDeg: u.meanDeg,
  }));
  const empty = { total: null, dispersive: null, polar: null, liquids: summary, excluded };
  if (used.length < 2) {
    return {
      ...empty,
      note:
        used.length === 0
          ? 'No drops of a probe liquid with known dispersive and polar components.'
          : `Only ${used[0].liquid.name.toLowerCase()} was measured; OWRK needs a second liquid of different polarity (e.g. water with diiodomethane).`,
    };
  }
  const measurements: AngleMeasurement[] = used.map((u) => ({
    liquid: {
      name: u.liquid.name,
      gammaTotal: u.liquid.gammaTotal,
      gammaDispersive: u.liquid.gammaDispersive,
      gammaPolar: u.liquid.gammaPolar,
    },
    angleDeg: u.meanDeg,
    angleSdDeg: u.n > 1 ? u.sdDeg / Math.sqrt(u.n) : 0,
  }));
  try {
    // First-order propagation: a comparison judges many batches at once, and for the small
    // spread of mean angles it agrees with the surface-energy page's Monte Carlo.
    const result = surfaceEnergyWithUncertainty('owrk', measurements, { propagation: 'linear' });
    const c = result.components as Record<string, ValueWithUncertainty>;
    return {
      total: c.gammaTotal,
      dispersive: c.gammaDispersive,
      polar: c.gammaPolar,
      liquids: summary,
      excluded,
      note: null,
    };
  } catch (error) {
    if (!(error instanceof SurfaceEnergyInputError)) throw error;
    return { ...empty, note: error.message };
  }
}

const mnm = (v: number) => `${Number(v.toFixed(1))} mN/m`;

function limitWords(spec: ComparisonSpecInput): string {
  const min = spec.minSurfaceEnergyMnM ?? null;
  const max = spec.maxSurfaceEnergyMnM ?? null;
  if (min !== null && max !== null) return `between ${mnm(min)} and ${mnm(max)}`;
  return min !== null ? `at least ${mnm(min)}` : `at most ${mnm(max as number)}`;
}

/** The limit line label, e.g. "≥ 38 mN/m, ≤ 7 d". */
export function surfaceEnergyLimitLabel(spec: ComparisonSpecInput): string {
  const parts: string[] = [];
  if ((spec.minSurfaceEnergyMnM ?? null) !== null)
    parts.push(`≥ ${mnm(spec.minSurfaceEnergyMnM as number)}`);
  if ((spec.maxSurfaceEnergyMnM ?? null) !== null)
    parts.push(`≤ ${mnm(spec.maxSurfaceEnergyMnM as number)}`);
  const window = spec.maxDaysSinceTreatment !== null ? `, ≤ ${spec.maxDaysSinceTreatment} d` : '';
  return `${parts.join(' and ')}${window}`;
}

/**
 * Judges one batch's value against one spec. The verdict is on the value itself (common
 * practice for a limit on a computed property); when the limit lies within the expanded
 * uncertainty the reason says the verdict is marginal.
 */
function judge(
  spec: ComparisonSpecInput,
  value: SurfaceEnergyValue,
  minDrops: number,
): SpecVerdict {
  const window =
    spec.maxDaysSinceTreatment !== null
      ? `; only drops measured within ${spec.maxDaysSinceTreatment} days of the sample's treatment count`
      : '';
  const rule = `surface free energy (OWRK) ${limitWords(spec)}${window}`;
  const n = value.liquids.reduce((sum, l) => sum + l.n, 0);
  const base = { specId: spec.id, rule, n, excluded: value.excluded };
  const later =
    value.excluded > 0 && spec.maxDaysSinceTreatment !== null
      ? ` ${value.excluded} drop${value.excluded === 1 ? '' : 's'} outside the ${spec.maxDaysSinceTreatment}-day window did not count.`
      : '';
  if (!value.total) {
    return {
      ...base,
      outcome: 'not-enough-data',
      reason: `No surface free energy: ${value.note}${later}`,
    };
  }
  const few = value.liquids.filter((l) => l.n < minDrops);
  if (few.length > 0) {
    return {
      ...base,
      outcome: 'not-enough-data',
      reason: `${few.map((l) => `${l.name} has ${l.n} drop${l.n === 1 ? '' : 's'}`).join(', ')}; a verdict needs at least ${minDrops} drops of each liquid.${later}`,
    };
  }
  const v = value.total.value;
  const expanded = COVERAGE_FACTOR * value.total.standardUncertainty;
  const min = spec.minSurfaceEnergyMnM ?? null;
  const max = spec.maxSurfaceEnergyMnM ?? null;
  const below = min !== null && v < min;
  const above = max !== null && v > max;
  const shown = `${v.toFixed(1)} ± ${expanded.toFixed(1)} mN/m`;
  const marginal = [min, max].some((limit) => limit !== null && Math.abs(v - limit) <= expanded);
  const caution = marginal
    ? ' The limit lies within the uncertainty of the value, so the verdict is marginal; measure more drops before relying on it.'
    : '';
  const reason = below
    ? `${shown} is below the minimum of ${mnm(min as number)}.`
    : above
      ? `${shown} is above the maximum of ${mnm(max as number)}.`
      : min !== null && max !== null
        ? `${shown} is within ${mnm(min)}–${mnm(max)}.`
        : min !== null
          ? `${shown} meets the minimum of ${mnm(min)}.`
          : `${shown} meets the maximum of ${mnm(max as number)}.`;
  return {
    ...base,
    outcome: below || above ? 'fail' : 'pass',
    reason: `${reason}${caution}${later}`,
  };
}

/**
 * The surface-energy part of a comparison: per batch the OWRK value with its uncertainty and
 * the verdict against each surface-energy spec. Null when the coating has no surface-energy
 * limit and no batch has two liquids of different polarity (nothing to show).
 */
export function compareSurfaceEnergy(
  batches: readonly ComparisonBatchInput[],
  liquids: readonly ComparisonLiquidInput[],
  specs: readonly ComparisonSpecInput[],
  dropsOf: (batchId: string) => DropPoint[],
  minDrops: number,
): SurfaceEnergyComparison | null {
  const split = new Map(liquids.filter(isSplit).map((l) => [l.id, l]));
  const limits = surfaceEnergySpecs(specs);
  // The shown value uses the first limit's age window, so it is the value that limit judged.
  const shownWindow = limits[0]?.maxDaysSinceTreatment ?? null;
  const results = batches.map((batch): BatchSurfaceEnergy => {
    const drops = dropsOf(batch.id);
    const shown = batchValue(drops, split, shownWindow);
    const verdicts = limits.map((spec) =>
      judge(
        spec,
        spec.maxDaysSinceTreatment === shownWindow
          ? shown
          : batchValue(drops, split, spec.maxDaysSinceTreatment),
        minDrops,
      ),
    );
    return { batch, ...shown, verdict: { outcome: overall(verdicts), specs: verdicts } };
  });
  if (limits.length === 0 && results.every((r) => r.total === null)) return null;
  return {
    method: SURFACE_ENERGY_METHOD,
    basis: SURFACE_ENERGY_BASIS,
    coverageFactor: COVERAGE_FACTOR,
    specs: limits,
    limitLabels: limits.map(surfaceEnergyLimitLabel),
    windowDays: shownWindow,
    batches: results,
  };
}
