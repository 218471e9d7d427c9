import 'server-only';
import { findOrganization, listMembersWithRoles } from '@/db/queries/organizations';
import { findUserById } from '@/db/queries/users';
import type { Transaction } from '@/db/queries/transaction';
import { can, ROLES } from '@/lib/auth/permissions';
import { appUrl } from '@/lib/config';
import { reviewOutcomeMail, reviewRequestMail } from '@/lib/reviews/notify';
import { enqueueMail } from '../mail/queue';
import type { LoadedReview } from './load';

/** "HT-200 B-0412 / P-01": what a review covers, in its mails. */
function reviewSubject(r: { coatingCode: string; lotCode: string; sampleLabel: string | null }) {
  return `${r.coatingCode} ${r.lotCode}${r.sampleLabel ? ` / ${r.sampleLabel}` : ''}`;
}

/**
 * Asks every member who may decide reviews (except the submitter) to look at a new review,
 * through the mail queue on the submission's transaction.
 */
export async function queueReviewRequestMails(
  tx: Transaction,
  input: {
    organizationId: string;
    reviewId: string;
    submittedByUserId: string;
    coatingCode: string;
    lotCode: string;
    sampleLabel: string | null;
    analysisCount: number;
    note: string;
  },
): Promise<number> {
  const deciders = ROLES.filter((role) => can(role, 'review:decide'));
  const [organization, submitter, reviewers] = await Promise.all([
    findOrganization(tx, input.organizationId),
    findUserById(tx, input.submittedByUserId),
    listMembersWithRoles(tx, input.organizationId, deciders),
  ]);
  const recipients = reviewers.filter((r) => r.userId !== input.submittedByUserId);
  for (const reviewer of recipients) {
    await enqueueMail(tx, {
      kind: 'review-request',
      ...reviewRequestMail({
        to: { email: reviewer.email, name: reviewer.name },
        organizationName: organization?.name ?? 'your lab',
        submitterName: submitter?.name ?? 'A member',
        analysisCount: input.analysisCount,
        note: input.note,
        subject: reviewSubject(input),
        link: `${appUrl()}/reviews/${input.reviewId}`,
      }),
    });
  }
  return recipients.length;
}

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
      subject: reviewSubject(review),
      link: `${appUrl()}/reviews/${review.id}`,
    }),
  });
}
