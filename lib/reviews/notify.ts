import { noticeMail, type MailMessage } from '@/lib/email/messages';

/** The mail that tells a submitter how their review ended (queued by server/reviews/decide.ts). */
export function reviewOutcomeMail(input: {
  to: { email: string; name: string | null };
  organizationName: string;
  status: 'approved' | 'rejected' | 'revoked';
  comment: string;
  reviewerName: string;
  /** What was reviewed, e.g. "HT-200 B-0412 / P-01". */
  subject: string;
  link: string;
}): MailMessage {
  const verdict = {
    approved: 'approved and signed',
    rejected: 'rejected',
    revoked: 'revoked the approval of',
  }[input.status];
  return noticeMail({
    to: input.to.email,
    subject:
      input.status === 'revoked'
        ? `Approval revoked: ${input.subject}`
        : `Results ${verdict}: ${input.subject}`,
    paragraphs: [
      `Hello ${input.to.name ?? ''},`.trim(),
      `${input.reviewerName} ${verdict} the results you submitted for ${input.subject} in ${input.organizationName}.`,
      ...(input.status === 'revoked'
        ? ['These results are no longer approved: they need a new review before they count again.']
        : []),
      ...(input.comment
        ? [`${input.status === 'revoked' ? 'Reason' : 'Comment'}: ${input.comment}`]
        : []),
    ],
    link: { href: input.link, label: 'Open the review' },
    footer: 'You get this mail because you submitted these results for review in Beadline.',
  });
}

/** The mail that asks a reviewer to look at newly submitted results (queued by server/reviews/submit.ts). */
export function reviewRequestMail(input: {
  to: { email: string; name: string | null };
  organizationName: string;
  submitterName: string;
  analysisCount: number;
  note: string;
  /** What was submitted, e.g. "HT-200 B-0412 / P-01". */
  subject: string;
  link: string;
}): MailMessage {
  const results = `${input.analysisCount} result${input.analysisCount === 1 ? '' : 's'}`;
  return noticeMail({
    to: input.to.email,
    subject: `Results to review: ${input.subject}`,
    paragraphs: [
      `Hello ${input.to.name ?? ''},`.trim(),
      `${input.submitterName} submitted ${results} of ${input.subject} for review in ${input.organizationName}.`,
      ...(input.note ? [`Note: ${input.note}`] : []),
    ],
    link: { href: input.link, label: 'Open the review' },
    footer: 'You get this mail because you may approve results in Beadline.',
  });
}
