import 'server-only';
import { and, desc, eq, inArray, isNull, max, sql, type SQL } from 'drizzle-orm';
import type {
  SavedSurfaceEnergyResult,
  SubjectSummary,
  SurfaceEnergyChoice,
  SurfaceEnergySubject,
} from '@/lib/contracts/surface-energy';
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
import { visibleSavedInputs, visibleStatus, type ResultVisibility } from './visibility';
import { findBatchWithCoating } from './batches';
import { liveDropsOf } from './drops';
import type { Executor } from './transaction';

/** Samples with their batch and coating. */
function samplesWithBatchAndCoating(where: SQL | undefined) {
  return getDb()
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
    .where(where);
}

/** The sample (or batch) with its batch, coating and surface-energy specs; null when not here. */
export async function findSurfaceEnergySubject(
  organizationId: string,
  subject: SurfaceEnergySubject,
): Promise<SubjectSummary | null> {
  const db = getDb();
  const byBatch = 'batchId' in subject;
  const row = byBatch
    ? await findBatchWithCoating(organizationId, subject.batchId).then(
        (batch) => batch && { ...batch, batchId: batch.id },
      )
    : (
        await samplesWithBatchAndCoating(
          and(eq(samples.id, subject.sampleId), eq(samples.organizationId, organizationId)),
        )
      )[0];
  if (!row) return null;
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
  const sampleRow: Partial<{ sampleId: string; sampleLabel: string; treatedAt: Date | null }> =
    'sampleId' in row ? row : {};
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
 * Every live drop of a sample (or of every live sample of a batch) by its latest analysis (max
 * revision), with its probe liquid, when it was measured and when its sample was treated, as
 * `visibility` allows.
 */
export async function listLatestDropAngles(
  organizationId: string,
  subject: SurfaceEnergySubject,
  options: { visibility: ResultVisibility },
) {
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
  return db
    .select({
      analysisId: analyses.id,
      meanDeg: analyses.meanDeg,
      measuredAt: drops.measuredAt,
      treatedAt: samples.treatedAt,
      liquid: probeLiquids,
    })
    .from(drops)
    .innerJoin(samples, eq(samples.id, drops.sampleId))
    .innerJoin(latest, eq(latest.dropId, drops.id))
    .innerJoin(
      analyses,
      and(eq(analyses.dropId, latest.dropId), eq(analyses.revision, latest.revision)),
    )
    .innerJoin(probeLiquids, eq(probeLiquids.id, drops.probeLiquidId))
    .where(
      and(
        liveDropsOf(organizationId),
        subjectFilter,
        visibleStatus(options.visibility, analyses.reviewStatus),
      ),
    )
    .orderBy(probeLiquids.name, analyses.id);
}

export async function insertSurfaceEnergyResult(
  db: Executor,
  row: typeof surfaceEnergyResults.$inferInsert,
): Promise<SavedSurfaceEnergyResult> {
  const [saved] = await db.insert(surfaceEnergyResults).values(row).returning();
  const { organizationId: _organizationId, ...result } = saved;
  return { ...result, createdByName: null };
}

/**
 * Saved results of a sample or batch, newest first; with `approved` visibility only those whose
 * every analysis is approved now.
 */
export async function listSurfaceEnergyResults(
  organizationId: string,
  subject: SurfaceEnergySubject,
  visibility: ResultVisibility,
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
        visibleSavedInputs(visibility, surfaceEnergyResults.inputs),
      ),
    )
    .orderBy(desc(surfaceEnergyResults.createdAt), desc(surfaceEnergyResults.id))
    .limit(limit);
  return rows.map(({ result: { organizationId: _organizationId, ...result }, createdByName }) => ({
    ...result,
    createdByName,
  }));
}

/** Coatings → batches → samples, for the page's picker. */
export async function listSurfaceEnergyChoices(
  organizationId: string,
): Promise<SurfaceEnergyChoice[]> {
  return samplesWithBatchAndCoating(
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
