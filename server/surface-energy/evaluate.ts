import 'server-only';
import { findSurfaceEnergySubject, listLatestDropAngles } from '@/db/queries/surface-energy';
import { notFound } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { resultVisibility, type ResultVisibility } from '../visibility';
import type {
  AngleTableRow,
  SampleSurfaceEnergyOptions,
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

/**
 * The angle table of a sample (or of every sample of a batch): per probe liquid, the mean, SD
 * and n of the drops' mean angles, each drop counted by its latest analysis, as `visibility` allows
 * (db/queries/visibility.ts).
 */
export async function angleTable(
  organizationId: string,
  subject: SurfaceEnergySubject,
  options: { visibility: ResultVisibility },
): Promise<AngleTableRow[]> {
  const rows = await listLatestDropAngles(organizationId, subject, options);
  const groups = new Map<
    string,
    { liquid: (typeof rows)[number]['liquid']; angles: number[]; ids: string[] }
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
  const table = await angleTable(organizationId, subject, { visibility });
  const liquids = angleTableToLiquids(table);
  return {
    subject: summary,
    angleTable: table,
    liquids,
    readAll,
    availability: methodAvailability(liquids),
    outputs: computeSurfaceEnergy(liquids, options),
  };
}
