import 'server-only';
import { findSurfaceEnergySubject, listLatestDropAngles } from '@/db/queries/surface-energy';
import { notFound } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { resultVisibility, type ResultVisibility } from '../visibility';
import { ageInDays, countsInWindow } from '@/lib/compare';
import type {
  AngleTableRow,
  SampleSurfaceEnergyOptions,
  SpecWindow,
  SubjectSummary,
  SurfaceEnergyEvaluation,
  SurfaceEnergySubject,
} from '@/lib/contracts/surface-energy';
import { describe } from '@/lib/stats';
import {
  angleTableToLiquids,
  computeSurfaceEnergy,
  methodAvailability,
} from '@/lib/surface-energy/compute';

export type SubjectKind = 'sample' | 'batch';

export const subjectOf = (kind: SubjectKind, id: string): SurfaceEnergySubject =>
  kind === 'sample' ? { sampleId: id } : { batchId: id };

type DropAngle = Awaited<ReturnType<typeof listLatestDropAngles>>[number];

/**
 * The angle table of drops: per probe liquid, the mean, SD and n of the drops' mean angles, each
 * drop counted by its latest analysis.
 */
function angleTableOf(rows: readonly DropAngle[]): AngleTableRow[] {
  const groups = new Map<
    string,
    { liquid: DropAngle['liquid']; angles: number[]; ids: string[] }
  >();
  for (const row of rows) {
    const group = groups.get(row.liquid.id) ?? { liquid: row.liquid, angles: [], ids: [] };
    group.angles.push(row.meanDeg);
    group.ids.push(row.analysisId);
    groups.set(row.liquid.id, group);
  }
  return [...groups.values()].map(({ liquid, angles, ids }) => {
    const stats = describe(angles);
    return {
      probeLiquidId: liquid.id,
      name: liquid.name,
      builtIn: liquid.organizationId === null,
      meanDeg: stats.mean,
      sdDeg: stats.sd,
      n: stats.n,
      gammaTotal: liquid.totalMnM,
      gammaDispersive: liquid.dispersiveMnM,
      gammaPolar: liquid.polarMnM,
      gammaLW: liquid.lifshitzVanDerWaalsMnM,
      gammaPlus: liquid.acidMnM,
      gammaMinus: liquid.baseMnM,
      sources: liquid.sources,
      hazardNote: liquid.hazardNote,
      analysisIds: ids,
    };
  });
}

/** The angle table of a sample (or of every sample of a batch), as `visibility` allows. */
export async function angleTable(
  organizationId: string,
  subject: SurfaceEnergySubject,
  options: { visibility: ResultVisibility },
): Promise<AngleTableRow[]> {
  return angleTableOf(await listLatestDropAngles(organizationId, subject, options));
}

/**
 * Each surface-energy spec with an age window judges only the drops measured within it, by the
 * compare page's rule (countsInWindow), computed with the same options as the page.
 */
function specWindowsOf(
  summary: SubjectSummary,
  rows: readonly DropAngle[],
  options: SampleSurfaceEnergyOptions,
): SpecWindow[] {
  return summary.surfaceEnergySpecs.flatMap((spec) => {
    const maxDays = spec.maxDaysSinceTreatment;
    if (maxDays === null) return [];
    const counted = rows.filter((row) =>
      countsInWindow(
        maxDays,
        ageInDays(row.measuredAt.toISOString(), row.treatedAt?.toISOString() ?? null),
      ),
    );
    const liquids = angleTableToLiquids(angleTableOf(counted));
    return [
      {
        specId: spec.id,
        maxDaysSinceTreatment: maxDays,
        counted: counted.length,
        excluded: rows.length - counted.length,
        liquids,
        outputs: computeSurfaceEnergy(liquids, options),
      },
    ];
  });
}

/**
 * A sample or batch (a batch pools the drops of all its live samples), its angle table, which
 * methods its liquids allow and what they compute to, with their uncertainty.
 */
export async function evaluateSurfaceEnergy(
  ctx: OrgContext,
  subject: SurfaceEnergySubject,
  options: SampleSurfaceEnergyOptions,
): Promise<SurfaceEnergyEvaluation> {
  const organizationId = ctx.organization.id;
  const visibility = resultVisibility(ctx.organization.role);
  const readAll = visibility === 'all';
  const summary = await findSurfaceEnergySubject(organizationId, subject);
  if (!summary) throw notFound('batchId' in subject ? 'That batch' : 'That sample');
  const rows = await listLatestDropAngles(organizationId, subject, { visibility });
  const table = angleTableOf(rows);
  const liquids = angleTableToLiquids(table);
  return {
    subject: summary,
    angleTable: table,
    liquids,
    specWindows: specWindowsOf(summary, rows, options),
    readAll,
    availability: methodAvailability(liquids),
    outputs: computeSurfaceEnergy(liquids, options),
  };
}
