import 'server-only';
import { createHash } from 'node:crypto';
import { and, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { HttpError, notFound } from '@/lib/api/errors';
import { getDb } from '../client';
import { analyses, batches, coatings, drops, probeLiquids, reviews, samples, users } from '../schema';
import { recordAudit } from './audit';
import { newId } from './ids';

/** Latest revision of every live drop under a batch (or one sample of it). */
async function latestAnalysesUnder(organizationId: string, batchId: string, sampleId: string | null) {
  const latest = getDb()
    .select({ dropId: analyses.dropId, latestRevision: sql<number>`max(${analyses.revision})`.as('latest_revision') })
    .from(analyses)
    .groupBy(analyses.dropId)
    .as('latest');
  return getDb()
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
    .innerJoin(analyses, and(eq(analyses.dropId, drops.id), eq(analyses.revision, latest.latestRevision)))
    .where(
      and(
        eq(drops.organizationId, organizationId),
        eq(samples.batchId, batchId),
        isNull(drops.archivedAt),
        sampleId ? eq(samples.id, sampleId) : undefined,
      ),
    )
    .orderBy(samples.label, probeLiquids.name, drops.measuredAt);
}

/** What is signed: the exact revisions and their angles, as a SHA-256 digest. */
function digestOf(rows: { analysisId: string; leftDeg: number; rightDeg: number }[]): string {
  const canonical = rows
    .map((r) => `${r.analysisId}:${r.leftDeg}:${r.rightDeg}`)
    .sort()
    .join('\n');
  return createHash('sha256').update(canonical).digest('hex');
}

export async function submitForReview(input: {
  organizationId: string;
  userId: string;
  batchId: string;
  sampleId: string | null;
  note: string;
}): Promise<{ reviewId: string; analysisCount: number }> {
  const db = getDb();
  const [batch] = await db
    .select({ id: batches.id })
    .from(batches)
    .where(and(eq(batches.id, input.batchId), eq(batches.organizationId, input.organizationId)));
  if (!batch) throw new HttpError(404, 'not_found', 'That batch was not found in this organization.', { batchId: 'Choose a batch of this organization.' });
  if (input.sampleId) {
    const [sample] = await db
      .select({ id: samples.id })
      .from(samples)
      .where(and(eq(samples.id, input.sampleId), eq(samples.batchId, input.batchId)));
    if (!sample) throw new HttpError(404, 'not_found', 'That sample is not part of the batch.', { sampleId: 'Choose a sample of this batch.' });
  }
  const rows = (await latestAnalysesUnder(input.organizationId, input.batchId, input.sampleId)).filter(
    (r) => r.reviewStatus === 'draft' || r.reviewStatus === 'rejected',
  );
  if (rows.length === 0) {
    throw new HttpError(
      409,
      'nothing_to_submit',
      'There are no new or rejected results to submit here: every latest result is already submitted or approved.',
    );
  }
  const reviewId = newId();
  await db.transaction(async (tx) => {
    await tx.insert(reviews).values({
      id: reviewId,
      organizationId: input.organizationId,
      scope: input.sampleId ? 'sample' : 'batch',
      batchId: input.batchId,
      sampleId: input.sampleId,
      analysisIds: rows.map((r) => r.analysisId),
      submittedByUserId: input.userId,
      submitNote: input.note,
    });
    await tx
      .update(analyses)
      .set({ reviewStatus: 'submitted' })
      .where(inArray(analyses.id, rows.map((r) => r.analysisId)));
    await recordAudit(tx, {
      actorUserId: input.userId,
      organizationId: input.organizationId,
      action: 'review.submit',
      entityType: 'review',
      entityId: reviewId,
      after: { batchId: input.batchId, sampleId: input.sampleId, analyses: rows.length, note: input.note },
    });
  });
  return { reviewId, analysisCount: rows.length };
}

const submitter = alias(users, 'submitter');
const decider = alias(users, 'decider');

export async function listReviews(organizationId: string, status?: 'submitted' | 'decided') {
  return getDb()
    .select({
      id: reviews.id,
      scope: reviews.scope,
      status: reviews.status,
      submittedAt: reviews.submittedAt,
      decidedAt: reviews.decidedAt,
      submitNote: reviews.submitNote,
      decisionComment: reviews.decisionComment,
      analysisIds: reviews.analysisIds,
      lotCode: batches.lotCode,
      coatingCode: coatings.code,
      sampleLabel: samples.label,
      submittedBy: submitter.name,
      decidedBy: decider.name,
    })
    .from(reviews)
    .innerJoin(batches, eq(batches.id, reviews.batchId))
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .leftJoin(samples, eq(samples.id, reviews.sampleId))
    .leftJoin(submitter, eq(submitter.id, reviews.submittedByUserId))
    .leftJoin(decider, eq(decider.id, reviews.decidedByUserId))
    .where(
      and(
        eq(reviews.organizationId, organizationId),
        status === 'submitted' ? eq(reviews.status, 'submitted') : status === 'decided' ? sql`${reviews.status} <> 'submitted'` : undefined,
      ),
    )
    .orderBy(desc(reviews.submittedAt))
    .limit(100);
}

export async function countPendingReviews(organizationId: string): Promise<number> {
  const [row] = await getDb()
    .select({ n: sql<number>`count(*)::int` })
    .from(reviews)
    .where(and(eq(reviews.organizationId, organizationId), eq(reviews.status, 'submitted')));
  return row?.n ?? 0;
}

export async function getReview(organizationId: string, reviewId: string) {
  const [review] = await getDb()
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
      lotCode: batches.lotCode,
      coatingCode: coatings.code,
      coatingName: coatings.name,
      sampleLabel: samples.label,
      submittedBy: submitter.name,
      submittedByEmail: submitter.email,
      decidedBy: decider.name,
    })
    .from(reviews)
    .innerJoin(batches, eq(batches.id, reviews.batchId))
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .leftJoin(samples, eq(samples.id, reviews.sampleId))
    .leftJoin(submitter, eq(submitter.id, reviews.submittedByUserId))
    .leftJoin(decider, eq(decider.id, reviews.decidedByUserId))
    .where(and(eq(reviews.organizationId, organizationId), eq(reviews.id, reviewId)));
  if (!review) return null;
  const current = await latestAnalysesUnder(organizationId, review.batchId, review.sampleId);
  const reviewed = new Set(review.analysisIds);
  return {
    ...review,
    rows: current
      .filter((r) => reviewed.has(r.analysisId))
      .map((r) => ({ ...r, superseded: false })),
    /** Drops re-analysed since submission: their reviewed revision is no longer the latest. */
    supersededCount: review.analysisIds.length - current.filter((r) => reviewed.has(r.analysisId)).length,
  };
}

/**
 * Approves (signed) or rejects a submitted review. Approval freezes the reviewed revisions as
 * approved; it is refused if any of them was re-analysed since submission.
 */
export async function decideReview(input: {
  organizationId: string;
  reviewer: { id: string; name: string; email: string };
  reviewId: string;
  decision: 'approve' | 'reject';
  comment: string;
}) {
  const review = await getReview(input.organizationId, input.reviewId);
  if (!review) throw notFound('That review');
  if (review.status !== 'submitted') {
    throw new HttpError(409, 'already_decided', `This review was already ${review.status}. Nothing was changed.`);
  }
  if (input.decision === 'approve' && review.supersededCount > 0) {
    throw new HttpError(
      409,
      'results_changed',
      `${review.supersededCount} of the submitted results were re-analysed after submission. Reject this review and ask for the new results to be submitted.`,
    );
  }
  const status: 'approved' | 'rejected' = input.decision === 'approve' ? 'approved' : 'rejected';
  const signedAt = new Date();
  const signature =
    input.decision === 'approve'
      ? {
          name: input.reviewer.name,
          email: input.reviewer.email,
          signedAt: signedAt.toISOString(),
          method: 'password-reconfirmed' as const,
          digest: digestOf(review.rows),
        }
      : null;
  await getDb().transaction(async (tx) => {
    const updated = await tx
      .update(reviews)
      .set({ status, decidedByUserId: input.reviewer.id, decidedAt: signedAt, decisionComment: input.comment, signature })
      .where(and(eq(reviews.id, input.reviewId), eq(reviews.status, 'submitted')))
      .returning({ id: reviews.id });
    if (updated.length === 0) {
      throw new HttpError(409, 'already_decided', 'Someone else decided this review a moment ago. Nothing was changed.');
    }
    const ids = review.rows.map((r) => r.analysisId);
    if (ids.length) await tx.update(analyses).set({ reviewStatus: status }).where(inArray(analyses.id, ids));
    await recordAudit(tx, {
      actorUserId: input.reviewer.id,
      organizationId: input.organizationId,
      action: input.decision === 'approve' ? 'review.approve' : 'review.reject',
      entityType: 'review',
      entityId: input.reviewId,
      before: { status: 'submitted' },
      after: { status, comment: input.comment, signature },
    });
  });
  return { status, signature, submitterEmail: review.submittedByEmail, submitterName: review.submittedBy, review };
}

/** Batches with results, for the submit form. */
export async function listBatchesWithResults(organizationId: string) {
  return getDb()
    .selectDistinct({ id: batches.id, lotCode: batches.lotCode, coatingCode: coatings.code, producedOn: batches.producedOn })
    .from(batches)
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .innerJoin(samples, eq(samples.batchId, batches.id))
    .innerJoin(drops, eq(drops.sampleId, samples.id))
    .where(and(eq(batches.organizationId, organizationId), isNull(batches.archivedAt)))
    .orderBy(coatings.code, desc(batches.producedOn));
}
