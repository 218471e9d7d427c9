import 'server-only';
import { listMembers } from '@/db/queries/organizations';
import { can } from '@/lib/auth/permissions';

/**
 * Four-eyes: who may decide a review. Only a member whose role may decide, and never the one who
 * submitted it. `others` lists them, so the review page can say when the lab has nobody else.
 */
export async function decidersOfReview(organizationId: string, submittedByUserId: string | null) {
  const members = await listMembers(organizationId);
  const others = members.filter(
    (m) => can(m.role, 'review:decide') && m.userId !== submittedByUserId,
  );
  return { others: others.map((m) => m.name) };
}

/** The message of the four-eyes refusal: who can decide instead. */
export function ownReviewMessage(organizationName: string, others: string[]): string {
  return others.length > 0
    ? `You submitted this review, so you cannot decide it. Another reviewer or admin of ${organizationName} must approve or reject it: ${others.join(', ')}.`
    : `You submitted this review, so you cannot decide it, and nobody else in ${organizationName} may decide reviews. An admin can invite a reviewer on the Team page.`;
}
