import { noticeMail, type MailMessage } from '@/lib/email/messages';

/*
 * Out-of-spec alerts: the pure part (a batch's overall outcome, the mail to a watcher). The
 * service that re-judges a batch and queues the mails is server/alerts/refresh-verdict.ts.
 */

export type BatchOutcome = 'pass' | 'fail' | 'not-enough-data' | 'no-spec';

/** A batch fails when any verdict (a probe liquid's, or surface energy) fails; else the weakest of the rest. */
export function overallOutcome(outcomes: readonly BatchOutcome[]): BatchOutcome {
  if (outcomes.includes('fail')) return 'fail';
  if (outcomes.includes('not-enough-data')) return 'not-enough-data';
  if (outcomes.includes('pass')) return 'pass';
  return 'no-spec';
}

/** The mail to one watcher of a coating whose batch has just turned out of spec. */
export function outOfSpecMail(input: {
  to: { email: string; name: string };
  coatingCode: string;
  lotCode: string;
  reasons: string[];
  link: string;
}): MailMessage {
  return noticeMail({
    to: input.to.email,
    subject: `Out of spec: ${input.coatingCode} batch ${input.lotCode}`,
    paragraphs: [
      `Hello ${input.to.name},`,
      `Batch ${input.lotCode} of ${input.coatingCode} is now out of spec.`,
      ...input.reasons,
    ],
    link: { href: input.link, label: 'See the comparison' },
    footer: 'You get this mail because you watch this coating in Beadline.',
  });
}
