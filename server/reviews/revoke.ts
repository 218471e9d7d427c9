import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { lockReview, revokeIfApproved, setAnalysesReviewStatus } from '@/db/queries/reviews';
import { inTransaction } from '@/db/queries/transaction';
import { AppError, notFound } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import type { RevokeReview } from '@/lib/contracts/reviews';
import { loadReview } from './load';
import { queueReviewOutcomeMail } from './notify';

const notApproved = (status: string) =>
  new AppError(
    'not_approved',
    `Only an approved review can be revoked; this one is ${status}. Nothing was changed.`,
  );

/**
 * Withdraws a signed approval: the only way an approval ends. The review becomes 'revoked' with
 * who, when and why; its approved analyses go back to draft (so they need a new review and
 * viewers no longer see them); the audit row keeps the signature that was withdrawn, and the
 * submitter is told by mail. One transaction, with the review row locked.
 */
export async function revokeReview(
  ctx: OrgContext,
  reviewId: string,
  input: RevokeReview,
): Promise<{ status: 'revoked' }> {
  const organizationId = ctx.organization.id;
  const review = await loadReview(organizationId, reviewId);
  if (!review) throw notFound('That review');
  if (review.status !== 'approved') throw notApproved(review.status);
  await inTransaction(async (tx) => {
    const locked = await lockReview(tx, reviewId);
    if (locked?.status !== 'approved') throw notApproved(locked?.status ?? 'changed');
    const revokedAt = new Date();
    await revokeIfApproved(tx, reviewId, {
      revokedByUserId: ctx.user.id,
      revokedAt,
      revokeReason: input.reason,
    });
    await setAnalysesReviewStatus(tx, review.analysisIds, 'draft', 'approved');
    await recordAudit(tx, {
      actorUserId: ctx.user.id,
      organizationId,
      action: 'review.revoke',
      entityType: 'review',
      entityId: reviewId,
      before: { status: 'approved', signature: review.signature },
      after: { status: 'revoked', reason: input.reason, revokedAt: revokedAt.toISOString() },
    });
    await queueReviewOutcomeMail(tx, {
      review,
      organizationName: ctx.organization.name,
      reviewerName: ctx.user.name,
      status: 'revoked',
      comment: input.reason,
    });
  });
  return { status: 'revoked' };
}
