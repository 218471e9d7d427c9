import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { findBatchWithCoating } from '@/db/queries/batches';
import { violatedUniqueConstraint } from '@/db/queries/records';
import {
  findSampleOfBatch,
  insertReview,
  latestAnalysesUnder,
  lockBatchForSubmission,
  setAnalysesReviewStatus,
} from '@/db/queries/reviews';
import { inTransaction } from '@/db/queries/transaction';
import { AppError } from '@/lib/app-error';
import type { SubmitReview } from '@/lib/contracts/reviews';
import type { Actor } from '../actor';
import { queueReviewRequestMails } from './notify';

/**
 * Submits the latest new or rejected results of a batch (or one sample of it) for review: the
 * review lists exactly those analysis revisions, which become 'submitted', with an audit row and
 * a mail to each member who may decide it.
 */
export async function submitForReview(
  actor: Actor,
  input: SubmitReview,
): Promise<{ reviewId: string; analysisCount: number }> {
  const sampleId = input.sampleId ?? null;
  const batch = await findBatchWithCoating(actor.organizationId, input.batchId);
  if (!batch) {
    throw new AppError('not_found', 'That batch was not found in this organization.', {
      fields: { batchId: 'Choose a batch of this organization.' },
    });
  }
  const sample = sampleId
    ? await findSampleOfBatch(actor.organizationId, input.batchId, sampleId)
    : null;
  if (sampleId && !sample) {
    throw new AppError('not_found', 'That sample is not part of the batch.', {
      fields: { sampleId: 'Choose a sample of this batch.' },
    });
  }
  const reviewId = newId();
  try {
    return await inTransaction(async (tx) => {
      // Submissions of one batch run one after the other; the second sees what the first took.
      await lockBatchForSubmission(tx, input.batchId);
      const rows = (
        await latestAnalysesUnder(actor.organizationId, input.batchId, sampleId, tx)
      ).filter((r) => r.reviewStatus === 'draft' || r.reviewStatus === 'rejected');
      if (rows.length === 0) throw nothingToSubmit();
      const analysisIds = rows.map((r) => r.analysisId);
      await insertReview(tx, {
        id: reviewId,
        organizationId: actor.organizationId,
        scope: sampleId ? 'sample' : 'batch',
        batchId: input.batchId,
        sampleId,
        analysisIds,
        submittedByUserId: actor.userId,
        submitNote: input.note,
      });
      await setAnalysesReviewStatus(tx, analysisIds, 'submitted');
      await recordAudit(tx, {
        actorUserId: actor.userId,
        organizationId: actor.organizationId,
        action: 'review.submit',
        entityType: 'review',
        entityId: reviewId,
        after: { batchId: input.batchId, sampleId, analyses: rows.length, note: input.note },
      });
      await queueReviewRequestMails(tx, {
        organizationId: actor.organizationId,
        reviewId,
        submittedByUserId: actor.userId,
        coatingCode: batch.coatingCode,
        lotCode: batch.lotCode,
        sampleLabel: sample?.label ?? null,
        analysisCount: rows.length,
        note: input.note,
      });
      return { reviewId, analysisCount: rows.length };
    });
  } catch (error) {
    // The partial unique index on open review items: another submission took them first.
    if (violatedUniqueConstraint(error) === 'review_items_open_analysis_unique') {
      throw nothingToSubmit();
    }
    throw error;
  }
}

const nothingToSubmit = () =>
  new AppError(
    'nothing_to_submit',
    'There are no new or rejected results to submit here: every latest result is already in a review waiting for its decision, or approved. Open Reviews to see it.',
  );
