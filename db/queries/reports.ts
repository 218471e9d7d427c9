import 'server-only';
import { dynamicLimitColumns } from './comparison';
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { analyses, drops, probeLiquids, reviews, samples, specs, users } from '../schema';
import { database } from './transaction';

/*
 * What the certificate of analysis of a batch reads besides the comparison (db/queries/comparison).
 */

/** The coating's live specs with their probe liquid's name. */
export async function listSpecsOfCoating(coatingId: string) {
  return database()
    .select({
      liquidName: probeLiquids.name,
      minDeg: specs.minDeg,
      maxDeg: specs.maxDeg,
      scope: specs.scope,
      minSurfaceEnergyMnM: specs.minSurfaceEnergyMnM,
      maxSurfaceEnergyMnM: specs.maxSurfaceEnergyMnM,
      maxDaysSinceTreatment: specs.maxDaysSinceTreatment,
      ...dynamicLimitColumns,
    })
    .from(specs)
    .innerJoin(probeLiquids, eq(probeLiquids.id, specs.probeLiquidId))
    .where(and(eq(specs.coatingId, coatingId), isNull(specs.archivedAt)));
}

/** The batch's live samples with their number of live drops, by label. */
export async function listSamplesWithDropCounts(batchId: string) {
  return database()
    .select({
      label: samples.label,
      substrate: samples.substrate,
      position: samples.position,
      treatedAt: samples.treatedAt,
      dropCount: sql<number>`count(${drops.id})::int`,
    })
    .from(samples)
    .leftJoin(drops, and(eq(drops.sampleId, samples.id), isNull(drops.archivedAt)))
    .where(and(eq(samples.batchId, batchId), isNull(samples.archivedAt)))
    .groupBy(samples.id)
    .orderBy(samples.label);
}

/** Every probe liquid's hazard note, by id. */
export async function probeLiquidHazards(): Promise<Map<string, string | null>> {
  const rows = await database()
    .select({ id: probeLiquids.id, hazardNote: probeLiquids.hazardNote })
    .from(probeLiquids);
  return new Map(rows.map((l) => [l.id, l.hazardNote]));
}

/** A drop's photo with its latest analysis (method, baseline, revision). */
export async function latestAnalysisOfDrop(dropId: string) {
  const [row] = await database()
    .select({
      photoId: drops.photoId,
      method: analyses.method,
      baseline: analyses.baseline,
      revision: analyses.revision,
    })
    .from(drops)
    .innerJoin(analyses, eq(analyses.dropId, drops.id))
    .where(eq(drops.id, dropId))
    .orderBy(desc(analyses.revision))
    .limit(1);
  return row ?? null;
}

/** The batch's latest approved whole-batch review, with the reviewer's name. */
export async function latestApprovedBatchReview(batchId: string) {
  const [review] = await database()
    .select({
      reviewerName: users.name,
      signature: reviews.signature,
      comment: reviews.decisionComment,
      analysisIds: reviews.analysisIds,
    })
    .from(reviews)
    .leftJoin(users, eq(users.id, reviews.decidedByUserId))
    .where(
      and(eq(reviews.batchId, batchId), eq(reviews.status, 'approved'), eq(reviews.scope, 'batch')),
    )
    .orderBy(desc(reviews.decidedAt))
    .limit(1);
  return review ?? null;
}

/** The analysis methods used on the batch's drops. */
export async function methodsUsedInBatch(batchId: string): Promise<string[]> {
  const rows = await database()
    .selectDistinct({ method: analyses.method })
    .from(analyses)
    .innerJoin(drops, eq(drops.id, analyses.dropId))
    .innerJoin(samples, eq(samples.id, drops.sampleId))
    .where(eq(samples.batchId, batchId));
  return rows.map((m) => m.method);
}
