import { idParamsSchema } from '@/lib/contracts/common';
import { reviewDecisionSchema } from '@/lib/contracts/reviews';
import { json, route } from '@/server/http/route';
import { decideReview } from '@/server/reviews/decide';

/**
 * Approve (signed: the reviewer enters their password again) or reject with a comment
 * → { status, signature }. The password check goes through the same rate limit as sign-in.
 */
export const POST = route(
  {
    access: 'review:decide',
    what: 'approve or reject results',
    params: idParamsSchema,
    body: reviewDecisionSchema,
  },
  async ({ ctx, params, body, ipAddress }) =>
    json(await decideReview(ctx, params.id, body, ipAddress)),
);
