import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { decideIfSubmitted, setAnalysesReviewStatus } from '@/db/queries/reviews';
import { inTransaction } from '@/db/queries/transaction';
import { AppError, notFound } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { checkCredentials } from '@/lib/auth/sign-in';
import type { ReviewDecision, Signature } from '@/lib/contracts/reviews';
import { signedDigest } from '@/lib/reviews/signature';
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

/**
 * Approves (signed) or rejects a submitted review. Approval freezes the reviewed revisions as
 * approved and is refused if any of them was re-analysed since submission. The decision, the
 * revisions' status, the audit row and the mail to the submitter are one transaction.
 */
export async function decideReview(
  ctx: OrgContext,
  reviewId: string,
  input: ReviewDecision,
  ipAddress: string,
): Promise<{ status: 'approved' | 'rejected'; signature: Signature | null }> {
  if (input.decision === 'approve') await checkSignature(ctx, input.password, ipAddress);
  const organizationId = ctx.organization.id;
  const review = await loadReview(organizationId, reviewId);
  if (!review) throw notFound('That review');
  if (review.status !== 'submitted') {
    throw new AppError(
      'already_decided',
      `This review was already ${review.status}. Nothing was changed.`,
    );
  }
  if (input.decision === 'approve' && review.supersededCount > 0) {
    throw new AppError(
      'results_changed',
      `${review.supersededCount} of the submitted results were re-analysed after submission. Reject this review and ask for the new results to be submitted.`,
    );
  }
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
    await setAnalysesReviewStatus(
      tx,
      review.rows.map((r) => r.analysisId),
      status,
    );
    await recordAudit(tx, {
      actorUserId: ctx.user.id,
      organizationId,
      action: input.decision === 'approve' ? 'review.approve' : 'review.reject',
      entityType: 'review',
      entityId: reviewId,
      before: { status: 'submitted' },
      after: { status, comment: input.comment, signature },
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
