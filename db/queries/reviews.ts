import 'server-only';
import { and, desc, eq, inArray, isNull, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { AnalysisReviewStatus, Signature } from '@/lib/contracts/reviews';
import { getDb } from '../client';
import {
  analyses,
  batches,
  coatings,
  drops,
  photos,
  probeLiquids,
  reviewItems,
  reviews,
  samples,
  users,
} from '../schema';
import { liveDropsOf } from './drops';
import type { Executor } from './transaction';

/** Latest revision of every live drop under a batch (or one sample of it). */
export async function latestAnalysesUnder(
  organizationId: string,
  batchId: string,
  sampleId: string | null,
  db: Executor = getDb(),
) {
  const latest = db
    .select({
      dropId: analyses.dropId,
      latestRevision: sql<number>`max(${analyses.revision})`.as('latest_revision'),
    })
    .from(analyses)
    .groupBy(analyses.dropId)
    .as('latest');
  return db
    .select({
      analysisId: analyses.id,
      dropId: drops.id,
      revision: analyses.revision,
      reviewStatus: analyses.reviewStatus,
      leftDeg: analyses.leftDeg,
      rightDeg: analyses.rightDeg,
      meanDeg: analyses.meanDeg,
      method: analyses.method,
      sampleId: samples.id,
      sampleLabel: samples.label,
      liquidName: probeLiquids.name,
    })
    .from(drops)
    .innerJoin(samples, eq(samples.id, drops.sampleId))
    .innerJoin(probeLiquids, eq(probeLiquids.id, drops.probeLiquidId))
    .innerJoin(latest, eq(latest.dropId, drops.id))
    .innerJoin(
      analyses,
      and(eq(analyses.dropId, drops.id), eq(analyses.revision, latest.latestRevision)),
    )
    .where(
      and(
        liveDropsOf(organizationId),
        eq(samples.batchId, batchId),
        sampleId ? eq(samples.id, sampleId) : undefined,
      ),
    )
    .orderBy(samples.label, probeLiquids.name, drops.measuredAt);
}

/**
 * Locks a batch row until the transaction ends, so submissions of its results run one after
 * the other: the second reads what the first committed.
 */
export async function lockBatchForSubmission(tx: Executor, batchId: string): Promise<void> {
  await tx.select({ id: batches.id }).from(batches).where(eq(batches.id, batchId)).for('update');
}

/**
 * A new review of the given analysis revisions with one open item each. The partial unique
 * index on open items refuses an analysis that is already in an open review (a 23505 the
 * service turns into a conflict).
 */
export async function insertReview(
  tx: Executor,
  row: typeof reviews.$inferInsert & { analysisIds: string[] },
): Promise<void> {
  await tx.insert(reviews).values(row);
  if (row.analysisIds.length === 0) return;
  await tx
    .insert(reviewItems)
    .values(row.analysisIds.map((analysisId) => ({ reviewId: row.id, analysisId })));
}

/** The review's status, its row locked until the transaction ends; null when there is none. */
export async function lockReview(tx: Executor, reviewId: string) {
  const [row] = await tx
    .select({ status: reviews.status })
    .from(reviews)
    .where(eq(reviews.id, reviewId))
    .for('update');
  return row ?? null;
}

/**
 * The review status of analysis revisions, their rows locked until the transaction ends, and
 * whether each is still its drop's latest revision.
 */
export async function lockAnalysesOfReview(tx: Executor, analysisIds: string[]) {
  if (analysisIds.length === 0) return [];
  return tx
    .select({
      id: analyses.id,
      reviewStatus: analyses.reviewStatus,
      latest: sql<boolean>`"analyses"."revision" = (select max(a2.revision) from analyses a2 where a2.drop_id = "analyses"."drop_id")`,
    })
    .from(analyses)
    .where(inArray(analyses.id, analysisIds))
    .for('update');
}

/** A decided review no longer holds its analyses: they may be submitted again (if rejected). */
export async function closeReviewItems(tx: Executor, reviewId: string): Promise<void> {
  await tx.update(reviewItems).set({ open: false }).where(eq(reviewItems.reviewId, reviewId));
}

/** Withdraws an approval; false when the review is not (or no longer) approved. */
export async function revokeIfApproved(
  tx: Executor,
  reviewId: string,
  revocation: { revokedByUserId: string; revokedAt: Date; revokeReason: string },
): Promise<boolean> {
  const updated = await tx
    .update(reviews)
    .set({ status: 'revoked', ...revocation })
    .where(and(eq(reviews.id, reviewId), eq(reviews.status, 'approved')))
    .returning({ id: reviews.id });
  return updated.length > 0;
}

/** Sets the review status of analysis revisions (only those now in `from`, when given). */
export async function setAnalysesReviewStatus(
  tx: Executor,
  analysisIds: string[],
  status: AnalysisReviewStatus,
  from?: AnalysisReviewStatus,
): Promise<void> {
  if (analysisIds.length === 0) return;
  await tx
    .update(analyses)
    .set({ reviewStatus: status })
    .where(
      and(inArray(analyses.id, analysisIds), from ? eq(analyses.reviewStatus, from) : undefined),
    );
}

/** Records the decision when the review is still submitted; false when someone decided first. */
export async function decideIfSubmitted(
  tx: Executor,
  reviewId: string,
  decision: {
    status: 'approved' | 'rejected';
    decidedByUserId: string;
    decidedAt: Date;
    decisionComment: string;
    signature: Signature | null;
  },
): Promise<boolean> {
  const updated = await tx
    .update(reviews)
    .set(decision)
    .where(and(eq(reviews.id, reviewId), eq(reviews.status, 'submitted')))
    .returning({ id: reviews.id });
  return updated.length > 0;
}

/** A sample that belongs to the batch, or null. */
export async function findSampleOfBatch(organizationId: string, batchId: string, sampleId: string) {
  const [row] = await getDb()
    .select({ id: samples.id, label: samples.label })
    .from(samples)
    .where(
      and(
        eq(samples.id, sampleId),
        eq(samples.batchId, batchId),
        eq(samples.organizationId, organizationId),
      ),
    );
  return row ?? null;
}

const submitter = alias(users, 'submitter');
const decider = alias(users, 'decider');
const revoker = alias(users, 'revoker');

/** A review with its batch, coating, sample and the people who submitted and decided it. */
function reviewsWithNames(where: SQL | undefined) {
  return getDb()
    .select({
      id: reviews.id,
      scope: reviews.scope,
      status: reviews.status,
      batchId: reviews.batchId,
      sampleId: reviews.sampleId,
      analysisIds: reviews.analysisIds,
      submittedAt: reviews.submittedAt,
      submitNote: reviews.submitNote,
      submittedByUserId: reviews.submittedByUserId,
      decidedAt: reviews.decidedAt,
      decisionComment: reviews.decisionComment,
      signature: reviews.signature,
      revokedAt: reviews.revokedAt,
      revokeReason: reviews.revokeReason,
      lotCode: batches.lotCode,
      coatingCode: coatings.code,
      coatingName: coatings.name,
      sampleLabel: samples.label,
      submittedBy: submitter.name,
      submittedByEmail: submitter.email,
      decidedBy: decider.name,
      revokedBy: revoker.name,
    })
    .from(reviews)
    .innerJoin(batches, eq(batches.id, reviews.batchId))
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .leftJoin(samples, eq(samples.id, reviews.sampleId))
    .leftJoin(submitter, eq(submitter.id, reviews.submittedByUserId))
    .leftJoin(decider, eq(decider.id, reviews.decidedByUserId))
    .leftJoin(revoker, eq(revoker.id, reviews.revokedByUserId))
    .where(where);
}

/**
 * The organization's reviews, newest first (100 from the start unless `position` says);
 * `submitted` for the queue, `decided` for the history.
 */
export async function listReviews(
  organizationId: string,
  status?: 'submitted' | 'decided',
  position: { offset: number; limit: number } = { offset: 0, limit: 100 },
) {
  return reviewsWithNames(
    and(
      eq(reviews.organizationId, organizationId),
      status === 'submitted'
        ? eq(reviews.status, 'submitted')
        : status === 'decided'
          ? sql`${reviews.status} <> 'submitted'`
          : undefined,
    ),
  )
    .orderBy(desc(reviews.submittedAt), desc(reviews.id))
    .limit(position.limit)
    .offset(position.offset);
}

/** A review of the organization; null when there is none here. */
export async function findReview(organizationId: string, reviewId: string) {
  const [review] = await reviewsWithNames(
    and(eq(reviews.organizationId, organizationId), eq(reviews.id, reviewId)),
  );
  return review ?? null;
}

/** Batches with results, for the submit form. */
export async function listBatchesWithResults(organizationId: string) {
  return getDb()
    .selectDistinct({
      id: batches.id,
      lotCode: batches.lotCode,
      coatingCode: coatings.code,
      producedOn: batches.producedOn,
    })
    .from(batches)
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .innerJoin(samples, eq(samples.batchId, batches.id))
    .innerJoin(drops, eq(drops.sampleId, samples.id))
    .where(and(eq(batches.organizationId, organizationId), isNull(batches.archivedAt)))
    .orderBy(coatings.code, desc(batches.producedOn));
}

/** The stored geometry of analysis revisions with their drop's photo size, for the review page. */
export async function analysesWithPhotos(organizationId: string, analysisIds: string[]) {
  if (analysisIds.length === 0) return [];
  return getDb()
    .select({
      analysisId: analyses.id,
      dropId: analyses.dropId,
      result: analyses.result,
      photoId: photos.id,
      photoWidth: photos.width,
      photoHeight: photos.height,
      photoName: photos.originalName,
    })
    .from(analyses)
    .innerJoin(drops, eq(drops.id, analyses.dropId))
    .leftJoin(photos, eq(photos.id, drops.photoId))
    .where(and(eq(analyses.organizationId, organizationId), inArray(analyses.id, analysisIds)));
}
