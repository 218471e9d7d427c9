import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import {
  closeReviewItems,
  decideIfSubmitted,
  lockAnalysesOfReview,
  lockReview,
  setAnalysesReviewStatus,
} from '@/db/queries/reviews';
import { inTransaction } from '@/db/queries/transaction';
import { emitWebhookEvent } from '../webhooks/emit';
import { AppError, notFound } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { checkCredentials } from '@/lib/auth/sign-in';
import type { ReviewDecision, Signature } from '@/lib/contracts/reviews';
import { signedDigest } from '@/lib/reviews/signature';
import { decidersOfReview, ownReviewMessage } from './deciders';
import { loadReview } from './load';
import { queueReviewOutcomeMail } from './notify';

/** An approval is signed: the reviewer's password again, through sign-in's rate-limited check. */
async function checkSignature(ctx: OrgContext, password: string, ipAddress: string) {
  const check = await checkCredentials({ email: ctx.user.email, password, ipAddress });
  if (check.ok && check.userId === ctx.user.id) return;
  throw new AppError(
    'signature_failed',
    check.ok
      ? 'The signature did not match your account.'
      : check.code === 'too_many_attempts'
        ? check.message
        : 'That password is not right, so the approval was not signed. Enter your own password again.',
    { fields: { password: 'Enter your own password to sign.' } },
  );
}

const alreadyDecided = (status: string) =>
  new AppError(
    'already_decided',
    status === 'approved'
      ? 'This review was already approved and signed. A signed approval can only be withdrawn by revoking it, with a reason. Nothing was changed.'
      : `This review was already ${status}. Nothing was changed.`,
  );

/**
 * Approves (signed) or rejects a submitted review. Never by its submitter (four-eyes). Inside the
 * transaction the review and its analyses are locked and checked again: the review must still
 * be submitted, and every analysis still 'submitted' (approval also needs each to be its drop's
 * latest revision), so a decision can never contradict another one. The decision, the
 * revisions' status, the audit row and the mail to the submitter are one transaction.
 */
export async function decideReview(
  ctx: OrgContext,
  reviewId: string,
  input: ReviewDecision,
  ipAddress: string,
): Promise<{ status: 'approved' | 'rejected'; signature: Signature | null }> {
  const organizationId = ctx.organization.id;
  const review = await loadReview(organizationId, reviewId);
  if (!review) throw notFound('That review');
  if (review.submittedByUserId === ctx.user.id) {
    const { others } = await decidersOfReview(organizationId, review.submittedByUserId);
    throw new AppError('own_review', ownReviewMessage(ctx.organization.name, others));
  }
  if (review.status !== 'submitted') throw alreadyDecided(review.status);
  if (input.decision === 'approve') await checkSignature(ctx, input.password, ipAddress);
  const status = input.decision === 'approve' ? 'approved' : 'rejected';
  const decidedAt = new Date();
  const signature: Signature | null =
    input.decision === 'approve'
      ? {
          name: ctx.user.name,
          email: ctx.user.email,
          signedAt: decidedAt.toISOString(),
          method: 'password-reconfirmed',
          digest: signedDigest(review.rows),
        }
      : null;
  await inTransaction(async (tx) => {
    const locked = await lockReview(tx, reviewId);
    if (locked?.status !== 'submitted') throw alreadyDecided(locked?.status ?? 'decided');
    const analyses = await lockAnalysesOfReview(tx, review.analysisIds);
    const changed =
      review.analysisIds.length - analyses.filter((a) => a.reviewStatus === 'submitted').length;
    if (changed > 0) {
      throw new AppError(
        'results_changed',
        `${changed} of the submitted results are no longer in the state that was reviewed (another review decided them). Nothing was changed; reload the review.`,
      );
    }
    const superseded = analyses.filter((a) => !a.latest).length;
    if (input.decision === 'approve' && superseded > 0) {
      throw new AppError(
        'results_changed',
        `${superseded} of the submitted results were re-analysed after submission. Reject this review and ask for the new results to be submitted.`,
      );
    }
    const decided = await decideIfSubmitted(tx, reviewId, {
      status,
      decidedByUserId: ctx.user.id,
      decidedAt,
      decisionComment: input.comment,
      signature,
    });
    if (!decided) {
      throw new AppError(
        'already_decided',
        'Someone else decided this review a moment ago. Nothing was changed.',
      );
    }
    await closeReviewItems(tx, reviewId);
    await setAnalysesReviewStatus(tx, review.analysisIds, status, 'submitted');
    await recordAudit(tx, {
      actorUserId: ctx.user.id,
      organizationId,
      action: input.decision === 'approve' ? 'review.approve' : 'review.reject',
      entityType: 'review',
      entityId: reviewId,
      before: { status: 'submitted' },
      after: { status, comment: input.comment, signature },
    });
    await emitWebhookEvent(tx, organizationId, 'review.decided', {
      reviewId,
      decision: status,
      scope: review.scope,
      batchId: review.batchId,
      lotCode: review.lotCode,
      coatingCode: review.coatingCode,
      sampleId: review.sampleId,
      analysisIds: review.analysisIds,
      comment: input.comment,
      decidedByUserId: ctx.user.id,
      decidedAt: decidedAt.toISOString(),
    });
    await queueReviewOutcomeMail(tx, {
      review,
      organizationName: ctx.organization.name,
      reviewerName: ctx.user.name,
      status,
      comment: input.comment,
    });
  });
  return { status, signature };
}
