import 'server-only';
import { dynamicLimitColumns } from './comparison';
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import {
  analyses,
  certificates,
  drops,
  measurementSessions,
  probeLiquids,
  reviews,
  samples,
  specs,
  users,
} from '../schema';
import { database, type Executor } from './transaction';

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

/**
 * The measurement sessions of the batch's live drops, per probe liquid: operator, conditions,
 * instrument, liquid lot, and the first and last measurement of the liquid's drops in it.
 */
export async function sessionsOfBatch(batchId: string) {
  return database()
    .select({
      liquidName: probeLiquids.name,
      operatorName: measurementSessions.operatorName,
      temperatureC: measurementSessions.temperatureC,
      humidityPct: measurementSessions.humidityPct,
      dropVolumeUl: measurementSessions.dropVolumeUl,
      instrumentNotes: measurementSessions.instrumentNotes,
      liquidLot: measurementSessions.liquidLot,
      firstMeasuredAt: sql<Date>`min(${drops.measuredAt})`.mapWith((v: string | Date) => new Date(v)),
      lastMeasuredAt: sql<Date>`max(${drops.measuredAt})`.mapWith((v: string | Date) => new Date(v)),
      dropCount: sql<number>`count(${drops.id})::int`,
    })
    .from(drops)
    .innerJoin(samples, eq(samples.id, drops.sampleId))
    .innerJoin(probeLiquids, eq(probeLiquids.id, drops.probeLiquidId))
    .leftJoin(measurementSessions, eq(measurementSessions.id, drops.sessionId))
    .where(and(eq(samples.batchId, batchId), isNull(drops.archivedAt), isNull(samples.archivedAt)))
    .groupBy(probeLiquids.name, measurementSessions.id)
    .orderBy(probeLiquids.name, sql`min(${drops.measuredAt})`);
}

/** The batch's newest whole-batch review of any status, with who decided it. */
export async function latestBatchReview(batchId: string) {
  const [review] = await database()
    .select({
      status: reviews.status,
      reviewerName: users.name,
      decidedAt: reviews.decidedAt,
      signature: reviews.signature,
      comment: reviews.decisionComment,
      analysisIds: reviews.analysisIds,
    })
    .from(reviews)
    .leftJoin(users, eq(users.id, reviews.decidedByUserId))
    .where(and(eq(reviews.batchId, batchId), eq(reviews.scope, 'batch')))
    .orderBy(desc(reviews.submittedAt))
    .limit(1);
  return review ?? null;
}

/** The stored certificate of a batch for an audience and fingerprint, or null. */
export async function findCertificate(
  batchId: string,
  audience: 'all' | 'approved',
  fingerprint: string,
) {
  const [row] = await database()
    .select()
    .from(certificates)
    .where(
      and(
        eq(certificates.batchId, batchId),
        eq(certificates.audience, audience),
        eq(certificates.fingerprint, fingerprint),
      ),
    );
  return row ?? null;
}

/** Stores a built certificate; a second build of the same fingerprint keeps the first. */
export async function insertCertificate(
  db: Executor,
  row: typeof certificates.$inferInsert,
): Promise<void> {
  await db.insert(certificates).values(row).onConflictDoNothing();
}
