import { decideReview } from '@/db/queries/reviews';
import { HttpError } from '@/lib/api/errors';
import { route } from '@/lib/auth/guard';
import { clientAddress } from '@/lib/auth/origin';
import { checkCredentials } from '@/lib/auth/sign-in';
import { notifyReviewOutcome } from '@/lib/reviews/notify';
import { reviewDecisionSchema } from '@/lib/validation/reviews';

type Params = { params: Promise<{ id: string }> };

/**
 * Approve (signed: the reviewer enters their password again) or reject with a comment. The
 * password check goes through the same rate-limited check as sign-in.
 */
export const POST = route<Params>(
  'review:decide',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const body = reviewDecisionSchema.parse(await request.json().catch(() => ({})));
    if (body.decision === 'approve') {
      const check = await checkCredentials({
        email: ctx.user.email,
        password: body.password,
        ipAddress: clientAddress(request.headers),
      });
      if (!check.ok || check.userId !== ctx.user.id) {
        throw new HttpError(
          403,
          'signature_failed',
          check.ok ? 'The signature did not match your account.' : check.code === 'too_many_attempts' ? check.message : 'That password is not right, so the approval was not signed. Enter your own password again.',
          { password: 'Enter your own password to sign.' },
        );
      }
    }
    const outcome = await decideReview({
      organizationId: ctx.organization.id,
      reviewer: ctx.user,
      reviewId: id,
      decision: body.decision,
      comment: body.comment,
    });
    await notifyReviewOutcome({
      organizationName: ctx.organization.name,
      reviewId: id,
      status: outcome.status,
      comment: body.comment,
      reviewerName: ctx.user.name,
      submitterEmail: outcome.submitterEmail,
      submitterName: outcome.submitterName,
      subject: `${outcome.review.coatingCode} ${outcome.review.lotCode}${outcome.review.sampleLabel ? ` / ${outcome.review.sampleLabel}` : ''}`,
    });
    return Response.json({ status: outcome.status, signature: outcome.signature });
  },
  { what: 'approve or reject results' },
);
