import 'server-only';
import { getDb } from '@/db/client';
import { enqueueMail } from '@/lib/email/queue';
import { appUrl } from '@/lib/config';

function escapeHtml(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

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
  const link = `${appUrl()}/reviews/${input.reviewId}`;
  const verdict = input.status === 'approved' ? 'approved and signed' : 'rejected';
  const lines = [
    `Hello ${input.submitterName ?? ''},`.trim(),
    `${input.reviewerName} ${verdict} the results you submitted for ${input.subject} in ${input.organizationName}.`,
    ...(input.comment ? [`Comment: ${input.comment}`] : []),
    `Open the review: ${link}`,
  ];
  await enqueueMail(getDb(), {
    kind: `review-${input.status}`,
    to: input.submitterEmail,
    subject: `Results ${verdict}: ${input.subject}`,
    text: `${lines.join('\n\n')}\n\n-- \nBeadline\n`,
    html: `<!doctype html><html lang="en"><body style="font-family:Helvetica,Arial,sans-serif;color:#1b2a2b">
<p style="font-weight:600;color:#134f52">Beadline</p>
${lines.map((l) => `<p>${escapeHtml(l)}</p>`).join('\n')}
</body></html>`,
  });
}
