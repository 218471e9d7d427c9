import 'server-only';
import { and, desc, eq, inArray, isNull, max, sql } from 'drizzle-orm';
import { notFound } from '@/lib/api/errors';
import { describe } from '@/lib/stats';
import type {
  LiquidAngle,
  SampleSurfaceEnergyOptions,
  SurfaceEnergyOutputs,
} from '@/lib/validation/surface-energy';
import { getDb } from '../client';
import {
  analyses,
  batches,
  coatings,
  drops,
  probeLiquids,
  samples,
  specs,
  surfaceEnergyResults,
  users,
} from '../schema';
import { newId } from './ids';
import { recordAudit } from './audit';
import type { Actor } from './records';

/** What a surface energy is computed for: one sample, or all samples of one batch. */
export type SurfaceEnergySubject = { sampleId: string } | { batchId: string };

export type SubjectSummary = {
  kind: 'sample' | 'batch';
  id: string;
  sampleLabel: string | null;
  batchId: string;
  lotCode: string;
  coatingId: string;
  coatingCode: string;
  coatingName: string;
  treatedAt: Date | null;
  /** Surface-energy limits of the coating's specs (mN/m), if any. */
  surfaceEnergySpecs: {
    id: string;
    min: number | null;
    max: number | null;
    /** The spec counts only drops measured within this many days of treatment. */
    maxDaysSinceTreatment: number | null;
    note: string;
  }[];
};

/** One probe liquid measured on the subject: the mean angle of its drops and its components. */
export type AngleTableRow = {
  probeLiquidId: string;
  name: string;
  builtIn: boolean;
  meanDeg: number;
  sdDeg: number | null;
  n: number;
  gammaTotal: number;
  gammaDispersive: number | null;
  gammaPolar: number | null;
  gammaLW: number | null;
  gammaPlus: number | null;
  gammaMinus: number | null;
  sources: Record<string, string>;
  hazardNote: string | null;
  /** Ids of the analyses (latest revision of each drop) the mean is taken from. */
  analysisIds: string[];
};

export async function getSurfaceEnergySubject(
  organizationId: string,
  subject: SurfaceEnergySubject,
): Promise<SubjectSummary> {
  const db = getDb();
  const byBatch = 'batchId' in subject;
  const [row] = byBatch
    ? await db
        .select({
          batchId: batches.id,
          lotCode: batches.lotCode,
          coatingId: coatings.id,
          coatingCode: coatings.code,
          coatingName: coatings.name,
        })
        .from(batches)
        .innerJoin(coatings, eq(coatings.id, batches.coatingId))
        .where(and(eq(batches.id, subject.batchId), eq(batches.organizationId, organizationId)))
    : await db
        .select({
          sampleId: samples.id,
          sampleLabel: samples.label,
          treatedAt: samples.treatedAt,
          batchId: batches.id,
          lotCode: batches.lotCode,
          coatingId: coatings.id,
          coatingCode: coatings.code,
          coatingName: coatings.name,
        })
        .from(samples)
        .innerJoin(batches, eq(batches.id, samples.batchId))
        .innerJoin(coatings, eq(coatings.id, batches.coatingId))
        .where(and(eq(samples.id, subject.sampleId), eq(samples.organizationId, organizationId)));
  if (!row) throw notFound(byBatch ? 'That batch' : 'That sample');
  const specRows = await db
    .select({
      id: specs.id,
      min: specs.minSurfaceEnergyMnM,
      max: specs.maxSurfaceEnergyMnM,
      maxDaysSinceTreatment: specs.maxDaysSinceTreatment,
      note: specs.note,
    })
    .from(specs)
    .where(
      and(
        eq(specs.coatingId, row.coatingId),
        eq(specs.organizationId, organizationId),
        isNull(specs.archivedAt),
        sql`(${specs.minSurfaceEnergyMnM} is not null or ${specs.maxSurfaceEnergyMnM} is not null)`,
      ),
    );
  const sampleRow = row as Partial<{
    sampleId: string;
    sampleLabel: string;
    treatedAt: Date | null;
  }>;
  return {
    kind: byBatch ? 'batch' : 'sample',
    id: byBatch ? row.batchId : (sampleRow.sampleId as string),
    sampleLabel: sampleRow.sampleLabel ?? null,
    batchId: row.batchId,
    lotCode: row.lotCode,
    coatingId: row.coatingId,
    coatingCode: row.coatingCode,
    coatingName: row.coatingName,
    treatedAt: sampleRow.treatedAt ?? null,
    surfaceEnergySpecs: specRows,
  };
}

/**
 * The angle table of a sample (or of every sample of a batch): per probe liquid, the mean, SD
 * and n of the drops' mean angles, each drop counted by its latest analysis (max revision).
 * Without `readAll` (viewers) a drop counts only when that latest analysis is approved.
 */
export async function listAngleTable(
  organizationId: string,
  subject: SurfaceEnergySubject,
  options: { readAll: boolean },
): Promise<AngleTableRow[]> {
  const db = getDb();
  const latest = db
    .select({ dropId: analyses.dropId, revision: max(analyses.revision).as('latest_revision') })
    .from(analyses)
    .where(eq(analyses.organizationId, organizationId))
    .groupBy(analyses.dropId)
    .as('latest');
  const subjectFilter =
    'batchId' in subject
      ? inArray(
          drops.sampleId,
          db
            .select({ id: samples.id })
            .from(samples)
            .where(and(eq(samples.batchId, subject.batchId), isNull(samples.archivedAt))),
        )
      : eq(drops.sampleId, subject.sampleId);
  const rows = await db
    .select({
      analysisId: analyses.id,
      meanDeg: analyses.meanDeg,
      liquid: probeLiquids,
    })
    .from(drops)
    .innerJoin(latest, eq(latest.dropId, drops.id))
    .innerJoin(
      analyses,
      and(eq(analyses.dropId, latest.dropId), eq(analyses.revision, latest.revision)),
    )
    .innerJoin(probeLiquids, eq(probeLiquids.id, drops.probeLiquidId))
    .where(
      and(
        eq(drops.organizationId, organizationId),
        isNull(drops.archivedAt),
        subjectFilter,
        options.readAll ? undefined : eq(analyses.reviewStatus, 'approved'),
      ),
    )
    .orderBy(probeLiquids.name, analyses.id);

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
 * The angle table as calculation input. A lab liquid without a dispersive/polar split carries
 * 0/0, which keeps it out of the split methods (OWRK, Wu, Fowkes); Zisman and Neumann use its
 * total alone.
 */
export function angleTableToLiquids(table: readonly AngleTableRow[]): LiquidAngle[] {
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

export type SurfaceEnergyInputs = {
  subject: { kind: 'sample' | 'batch'; id: string };
  options: SampleSurfaceEnergyOptions;
  /** The angle table exactly as used, components and their sources included. */
  liquids: AngleTableRow[];
  readAll: boolean;
};

export type SavedSurfaceEnergyResult = {
  id: string;
  sampleId: string | null;
  batchId: string | null;
  inputs: SurfaceEnergyInputs;
  outputs: SurfaceEnergyOutputs;
  createdByUserId: string | null;
  createdByName: string | null;
  createdAt: Date;
};

export async function saveSurfaceEnergyResult(
  actor: Actor,
  subject: SurfaceEnergySubject,
  inputs: SurfaceEnergyInputs,
  outputs: SurfaceEnergyOutputs,
): Promise<SavedSurfaceEnergyResult> {
  const id = newId();
  const sampleId = 'sampleId' in subject ? subject.sampleId : null;
  const batchId = 'batchId' in subject ? subject.batchId : null;
  const [row] = await getDb().transaction(async (tx) => {
    const inserted = await tx
      .insert(surfaceEnergyResults)
      .values({
        id,
        organizationId: actor.organizationId,
        sampleId,
        batchId,
        inputs: inputs as unknown as Record<string, unknown>,
        outputs: outputs as unknown as Record<string, unknown>,
        createdByUserId: actor.userId,
      })
      .returning();
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'surface_energy_result.create',
      entityType: 'surface_energy_result',
      entityId: id,
      after: { sampleId, batchId, methods: inputs.options.methods },
    });
    return inserted;
  });
  return {
    id: row.id,
    sampleId: row.sampleId,
    batchId: row.batchId,
    inputs,
    outputs,
    createdByUserId: row.createdByUserId,
    createdByName: null,
    createdAt: row.createdAt,
  };
}

/** Saved results of a sample or batch, newest first. */
export async function listSurfaceEnergyResults(
  organizationId: string,
  subject: SurfaceEnergySubject,
  limit = 50,
): Promise<SavedSurfaceEnergyResult[]> {
  const rows = await getDb()
    .select({ result: surfaceEnergyResults, createdByName: users.name })
    .from(surfaceEnergyResults)
    .leftJoin(users, eq(users.id, surfaceEnergyResults.createdByUserId))
    .where(
      and(
        eq(surfaceEnergyResults.organizationId, organizationId),
        'sampleId' in subject
          ? eq(surfaceEnergyResults.sampleId, subject.sampleId)
          : eq(surfaceEnergyResults.batchId, subject.batchId),
      ),
    )
    .orderBy(desc(surfaceEnergyResults.createdAt), desc(surfaceEnergyResults.id))
    .limit(limit);
  return rows.map(({ result, createdByName }) => ({
    id: result.id,
    sampleId: result.sampleId,
    batchId: result.batchId,
    inputs: result.inputs as unknown as SurfaceEnergyInputs,
    outputs: result.outputs as unknown as SurfaceEnergyOutputs,
    createdByUserId: result.createdByUserId,
    createdByName,
    createdAt: result.createdAt,
  }));
}

/** Coatings → batches → samples, for the page's picker. */
export async function listSurfaceEnergyChoices(organizationId: string) {
  return getDb()
    .select({
      sampleId: samples.id,
      sampleLabel: samples.label,
      batchId: batches.id,
      lotCode: batches.lotCode,
      coatingId: coatings.id,
      coatingCode: coatings.code,
      coatingName: coatings.name,
    })
    .from(samples)
    .innerJoin(batches, eq(batches.id, samples.batchId))
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .where(
      and(
        eq(samples.organizationId, organizationId),
        isNull(samples.archivedAt),
        isNull(batches.archivedAt),
        isNull(coatings.archivedAt),
      ),
    )
    .orderBy(coatings.code, batches.lotCode, samples.label)
    .limit(2000);
}
