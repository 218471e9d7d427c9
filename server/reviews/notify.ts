import 'server-only';
import type { Transaction } from '@/db/queries/transaction';
import { appUrl } from '@/lib/config';
import { reviewOutcomeMail } from '@/lib/reviews/notify';
import { enqueueMail } from '../mail/queue';
import type { LoadedReview } from './load';

/** Tells the submitter how their review ended, through the mail queue on the decision's transaction. */
export async function queueReviewOutcomeMail(
  tx: Transaction,
  input: {
    review: Pick<
      LoadedReview,
      'id' | 'submittedByEmail' | 'submittedBy' | 'coatingCode' | 'lotCode' | 'sampleLabel'
    >;
    organizationName: string;
    reviewerName: string;
    status: 'approved' | 'rejected' | 'revoked';
    comment: string;
  },
): Promise<void> {
  const { review } = input;
  if (!review.submittedByEmail) return;
  await enqueueMail(tx, {
    kind: `review-${input.status}`,
    ...reviewOutcomeMail({
      to: { email: review.submittedByEmail, name: review.submittedBy },
      organizationName: input.organizationName,
      status: input.status,
      comment: input.comment,
      reviewerName: input.reviewerName,
      subject: `${review.coatingCode} ${review.lotCode}${review.sampleLabel ? ` / ${review.sampleLabel}` : ''}`,
      link: `${appUrl()}/reviews/${review.id}`,
    }),
  });
}
