import { idParamsSchema } from '@/lib/contracts/common';
import { revokeReviewSchema } from '@/lib/contracts/reviews';
import { json, route } from '@/server/http/route';
import { revokeReview } from '@/server/reviews/revoke';

/** Withdraws a signed approval with its reason (audited, mailed to the submitter) → { status }. */
export const POST = route(
  {
    access: 'review:decide',
    what: 'revoke an approval',
    params: idParamsSchema,
    body: revokeReviewSchema,
  },
  async ({ ctx, params, body }) => json(await revokeReview(ctx, params.id, body)),
);
