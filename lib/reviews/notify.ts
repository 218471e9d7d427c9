import 'server-only';
import { getDb } from '@/db/client';
import { noticeMail } from '@/lib/email/messages';
import { enqueueMail } from '@/lib/email/queue';
import { appUrl } from '@/lib/config';

/** Tells the submitter how their review ended, through the mail queue (retried until sent). */
export async function notifyReviewOutcome(input: {
  organizationName: string;
  reviewId: string;
  status: 'approved' | 'rejected';
  comment: string;
  reviewerName: string;
  submitterEmail: string | null;
  submitterName: string | null;
  subject: string;
}): Promise<void> {
  if (!input.submitterEmail) return;
  const verdict = input.status === 'approved' ? 'approved and signed' : 'rejected';
  await enqueueMail(getDb(), {
    kind: `review-${input.status}`,
    ...noticeMail({
      to: input.submitterEmail,
      subject: `Results ${verdict}: ${input.subject}`,
      paragraphs: [
        `Hello ${input.submitterName ?? ''},`.trim(),
        `${input.reviewerName} ${verdict} the results you submitted for ${input.subject} in ${input.organizationName}.`,
        ...(input.comment ? [`Comment: ${input.comment}`] : []),
      ],
      link: { href: `${appUrl()}/reviews/${input.reviewId}`, label: 'Open the review' },
      footer: 'You get this mail because you submitted these results for review in Beadline.',
    }),
  });
}
