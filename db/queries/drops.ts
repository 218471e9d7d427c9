import 'server-only';
import { and, asc, desc, eq, inArray, isNull, sql, type SQL } from 'drizzle-orm';
import type { PgSelect } from 'drizzle-orm/pg-core';
import { getDb } from '../client';
import {
  analyses,
  batches,
  coatings,
  drops,
  measurementSessions,
  photos,
  probeLiquids,
  samples,
  users,
} from '../schema';
import type { Baseline, FitMethod } from '@/lib/analysis/types';
import type {
  AnalysisRevision,
  DropOfPhoto,
  KeptAnalysisResult,
  StoredAnalysisOptions,
} from '@/lib/contracts/drops';
import { SOFTWARE_VERSION } from '@/lib/measure/version';
import { probeLiquidVisibleTo } from './records';
import type { Executor } from './transaction';
import { visibleStatus, type ResultVisibility } from './visibility';

/** Serialises saves of one photo, so two tabs cannot both create revision n. */
export async function lockPhotoDrops(tx: Executor, photoId: string): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${photoId}))`);
}

/** The live drop saved from a photo, if any. */
export async function findLiveDropOfPhoto(tx: Executor, photoId: string) {
  const [row] = await tx
    .select({
      id: drops.id,
      sampleId: drops.sampleId,
      probeLiquidId: drops.probeLiquidId,
      sessionId: drops.sessionId,
    })
    .from(drops)
    .where(and(eq(drops.photoId, photoId), isNull(drops.archivedAt)));
  return row ?? null;
}

export async function moveDrop(
  tx: Executor,
  dropId: string,
  to: { sampleId: string; probeLiquidId: string; sessionId: string | null },
): Promise<void> {
  await tx.update(drops).set(to).where(eq(drops.id, dropId));
}

export type NewDrop = typeof drops.$inferInsert;
export type NewAnalysis = typeof analyses.$inferInsert;

/** Inserts drops, and then analyses, in chunks (PostgreSQL takes at most 65 535 parameters). */
export async function insertDropsAndAnalyses(
  tx: Executor,
  dropRows: NewDrop[],
  analysisRows: NewAnalysis[],
): Promise<void> {
  for (let i = 0; i < dropRows.length; i += 1000) {
    await tx.insert(drops).values(dropRows.slice(i, i + 1000));
  }
  for (let i = 0; i < analysisRows.length; i += 1000) {
    await tx.insert(analyses).values(analysisRows.slice(i, i + 1000));
  }
}

/**
 * The row of an analysis the engine computed: the angles and their uncertainties are copied
 * from the result into their columns (for sorting and statistics), the result is kept whole.
 */
export function engineAnalysisRow(input: {
  id: string;
  organizationId: string;
  dropId: string;
  revision: number;
  method: FitMethod;
  baseline: Baseline | null;
  options: StoredAnalysisOptions;
  result: KeptAnalysisResult;
  reason?: string | null;
  sessionId?: string | null;
  createdByUserId: string;
  createdAt?: Date;
}): NewAnalysis {
  const { result } = input;
  return {
    ...input,
    leftDeg: result.leftDeg,
    rightDeg: result.rightDeg,
    meanDeg: result.meanDeg,
    leftUncertaintyDeg: result.leftUncertaintyDeg,
    rightUncertaintyDeg: result.rightUncertaintyDeg,
    softwareVersion: SOFTWARE_VERSION,
  };
}

/** The revision number the drop's next analysis gets. */
export async function nextRevision(tx: Executor, dropId: string): Promise<number> {
  const [{ next }] = await tx
    .select({ next: sql<number>`coalesce(max(${analyses.revision}), 0) + 1` })
    .from(analyses)
    .where(eq(analyses.dropId, dropId));
  return Number(next);
}

/** The organization's drops that are not archived. */
export function liveDropsOf(organizationId: string): SQL {
  return and(eq(drops.organizationId, organizationId), isNull(drops.archivedAt)) as SQL;
}

/** Joins a query of drops to where each drop sits: its sample, batch and coating. */
function withPlace<Query extends PgSelect>(query: Query) {
  return query
    .innerJoin(samples, eq(samples.id, drops.sampleId))
    .innerJoin(batches, eq(batches.id, samples.batchId))
    .innerJoin(coatings, eq(coatings.id, batches.coatingId));
}

/** The drop saved from a photo (if any) with all its analysis revisions, newest first. */
export async function getDropOfPhoto(
  organizationId: string,
  photoId: string,
): Promise<DropOfPhoto> {
  const [drop] = await withPlace(
    getDb()
      .select({
        id: drops.id,
        sampleId: drops.sampleId,
        probeLiquidId: drops.probeLiquidId,
        sessionId: drops.sessionId,
        sampleLabel: samples.label,
        lotCode: batches.lotCode,
        coatingCode: coatings.code,
      })
      .from(drops)
      .$dynamic(),
  ).where(and(eq(drops.photoId, photoId), liveDropsOf(organizationId)));
  if (!drop) return null;
  const revisions = await revisionsOfDrop(drop.id);
  return { ...drop, revisions };
}

const revisionColumns = {
  id: analyses.id,
  revision: analyses.revision,
  method: analyses.method,
  baseline: analyses.baseline,
  leftDeg: analyses.leftDeg,
  rightDeg: analyses.rightDeg,
  meanDeg: analyses.meanDeg,
  leftUncertaintyDeg: analyses.leftUncertaintyDeg,
  rightUncertaintyDeg: analyses.rightUncertaintyDeg,
  softwareVersion: analyses.softwareVersion,
  reviewStatus: analyses.reviewStatus,
  createdAt: analyses.createdAt,
  createdByUserId: analyses.createdByUserId,
};

/** Every analysis revision of a drop, newest first. */
export async function revisionsOfDrop(dropId: string): Promise<AnalysisRevision[]> {
  return getDb()
    .select({ ...revisionColumns, result: analyses.result })
    .from(analyses)
    .where(eq(analyses.dropId, dropId))
    .orderBy(desc(analyses.revision));
}

export type DropFilters = {
  dropId?: string;
  sampleId?: string;
  batchId?: string;
  probeLiquidId?: string;
  sessionId?: string;
};

/**
 * Live drops of an organization with their sample, batch and coating and their latest analysis
 * revision (without its full result), newest first; `limit` rows from `offset`.
 */
export async function listDropsWithLatest(
  organizationId: string,
  filters: DropFilters,
  position: { offset: number; limit: number },
) {
  const db = getDb();
  const latest = db
    .selectDistinctOn([analyses.dropId], { dropId: analyses.dropId, ...revisionColumns })
    .from(analyses)
    .where(eq(analyses.organizationId, organizationId))
    .orderBy(analyses.dropId, desc(analyses.revision))
    .as('latest');
  const rows = await withPlace(
    getDb()
      .select({
        id: drops.id,
        sampleId: drops.sampleId,
        probeLiquidId: drops.probeLiquidId,
        sessionId: drops.sessionId,
        photoId: drops.photoId,
        source: drops.source,
        sampleLabel: samples.label,
        batchId: batches.id,
        lotCode: batches.lotCode,
        coatingCode: coatings.code,
        createdAt: drops.createdAt,
        latest: {
          id: latest.id,
          revision: latest.revision,
          method: latest.method,
          baseline: latest.baseline,
          leftDeg: latest.leftDeg,
          rightDeg: latest.rightDeg,
          meanDeg: latest.meanDeg,
          leftUncertaintyDeg: latest.leftUncertaintyDeg,
          rightUncertaintyDeg: latest.rightUncertaintyDeg,
          softwareVersion: latest.softwareVersion,
          reviewStatus: latest.reviewStatus,
          createdAt: latest.createdAt,
          createdByUserId: latest.createdByUserId,
        },
      })
      .from(drops)
      .$dynamic(),
  )
    .leftJoin(latest, eq(latest.dropId, drops.id))
    .where(
      and(
        liveDropsOf(organizationId),
        filters.dropId ? eq(drops.id, filters.dropId) : undefined,
        filters.sampleId ? eq(drops.sampleId, filters.sampleId) : undefined,
        filters.batchId ? eq(samples.batchId, filters.batchId) : undefined,
        filters.probeLiquidId ? eq(drops.probeLiquidId, filters.probeLiquidId) : undefined,
        filters.sessionId ? eq(drops.sessionId, filters.sessionId) : undefined,
      ),
    )
    .orderBy(desc(drops.createdAt), asc(drops.id))
    .limit(position.limit)
    .offset(position.offset);
  return rows.map(({ latest: revision, ...drop }) => ({
    ...drop,
    latestAnalysis: revision?.id ? revision : null,
  }));
}

/** Samples to save drops to, with their batch and coating, for the workspace's picker. */
export async function listSampleChoices(organizationId: string) {
  return getDb()
    .select({
      id: samples.id,
      label: samples.label,
      batchId: batches.id,
      lotCode: batches.lotCode,
      coatingCode: coatings.code,
      coatingName: coatings.name,
    })
    .from(samples)
    .innerJoin(batches, eq(batches.id, samples.batchId))
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .where(and(eq(samples.organizationId, organizationId), isNull(samples.archivedAt)))
    .orderBy(asc(coatings.code), desc(batches.producedOn), asc(samples.label))
    .limit(500);
}

export async function listProbeLiquidChoices(organizationId: string) {
  return getDb()
    .select({ id: probeLiquids.id, name: probeLiquids.name, hazardNote: probeLiquids.hazardNote })
    .from(probeLiquids)
    .where(and(probeLiquidVisibleTo(organizationId), isNull(probeLiquids.archivedAt)))
    .orderBy(asc(probeLiquids.name));
}

/**
 * For each of these photos saved to a live drop: the drop's sample, liquid and session and its
 * latest revision's number, method and baseline (what the workspace shows as saved).
 */
export async function listSavedStateOfPhotos(organizationId: string, photoIds: string[]) {
  if (photoIds.length === 0) return [];
  return getDb()
    .selectDistinctOn([drops.photoId], {
      photoId: sql<string>`${drops.photoId}`,
      dropId: drops.id,
      sampleId: drops.sampleId,
      probeLiquidId: drops.probeLiquidId,
      sessionId: drops.sessionId,
      revision: analyses.revision,
      method: analyses.method,
      baseline: analyses.baseline,
    })
    .from(drops)
    .innerJoin(analyses, eq(analyses.dropId, drops.id))
    .where(and(liveDropsOf(organizationId), inArray(drops.photoId, photoIds)))
    .orderBy(drops.photoId, desc(analyses.revision));
}

/** A measurement session's conditions, or null. */
export async function getSessionConditions(organizationId: string, sessionId: string) {
  const [row] = await getDb()
    .select({
      id: measurementSessions.id,
      operatorName: measurementSessions.operatorName,
      probeLiquidId: measurementSessions.probeLiquidId,
      temperatureC: measurementSessions.temperatureC,
      humidityPct: measurementSessions.humidityPct,
      dropVolumeUl: measurementSessions.dropVolumeUl,
      scalePxPerMm: measurementSessions.scalePxPerMm,
      liquidLot: measurementSessions.liquidLot,
    })
    .from(measurementSessions)
    .where(
      and(
        eq(measurementSessions.organizationId, organizationId),
        eq(measurementSessions.id, sessionId),
      ),
    );
  return row ?? null;
}

/** A drop of the organization with where it sits and its photo, or null. */
export async function getDropDetail(organizationId: string, dropId: string) {
  const [row] = await withPlace(
    getDb()
      .select({
        id: drops.id,
        source: drops.source,
        measuredAt: drops.measuredAt,
        archivedAt: drops.archivedAt,
        sampleLabel: samples.label,
        batchId: batches.id,
        lotCode: batches.lotCode,
        coatingCode: coatings.code,
        coatingName: coatings.name,
        liquidName: probeLiquids.name,
        photoId: photos.id,
        photoName: photos.originalName,
        photoWidth: photos.width,
        photoHeight: photos.height,
      })
      .from(drops)
      .$dynamic(),
  )
    .innerJoin(probeLiquids, eq(probeLiquids.id, drops.probeLiquidId))
    .leftJoin(photos, eq(photos.id, drops.photoId))
    .where(and(eq(drops.organizationId, organizationId), eq(drops.id, dropId)));
  return row ?? null;
}

/**
 * A drop's revisions, newest first, each with who made it, why, and the conditions of its
 * session (the revision's own, else the drop's for revisions saved before sessions were kept
 * per revision). With `approved` visibility: only approved revisions, and none unless the
 * drop's latest revision is approved (db/queries/visibility.ts).
 */
export async function listDropRevisions(dropId: string, visibility: ResultVisibility) {
  const session = sql`coalesce(${analyses.sessionId}, ${drops.sessionId})`;
  return getDb()
    .select({
      id: analyses.id,
      revision: analyses.revision,
      createdAt: analyses.createdAt,
      createdBy: users.name,
      method: analyses.method,
      baseline: analyses.baseline,
      options: analyses.options,
      reason: analyses.reason,
      reviewStatus: analyses.reviewStatus,
      leftDeg: analyses.leftDeg,
      rightDeg: analyses.rightDeg,
      meanDeg: analyses.meanDeg,
      leftUncertaintyDeg: analyses.leftUncertaintyDeg,
      rightUncertaintyDeg: analyses.rightUncertaintyDeg,
      softwareVersion: analyses.softwareVersion,
      warnings: sql<{ code: string; message: string }[] | null>`${analyses.result} -> 'warnings'`,
      operatorName: measurementSessions.operatorName,
      temperatureC: measurementSessions.temperatureC,
      humidityPct: measurementSessions.humidityPct,
      dropVolumeUl: measurementSessions.dropVolumeUl,
      scalePxPerMm: measurementSessions.scalePxPerMm,
    })
    .from(analyses)
    .innerJoin(drops, eq(drops.id, analyses.dropId))
    .leftJoin(users, eq(users.id, analyses.createdByUserId))
    .leftJoin(measurementSessions, sql`${measurementSessions.id} = ${session}`)
    .where(
      and(
        eq(analyses.dropId, dropId),
        visibleStatus(visibility, analyses.reviewStatus),
        visibility === 'all'
          ? undefined
          : sql`(select latest.review_status from analyses latest
                 where latest.drop_id = ${analyses.dropId}
                 order by latest.revision desc limit 1) = 'approved'`,
      ),
    )
    .orderBy(desc(analyses.revision));
}
