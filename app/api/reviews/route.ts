import { reviewListQuerySchema, submitReviewSchema } from '@/lib/contracts/reviews';
import { json, route } from '@/server/http/route';
import { listReviews } from '@/server/reviews/load';
import { submitForReview } from '@/server/reviews/submit';

/** Reviews of the organization; ?status=submitted for the queue, ?status=decided for the history. */
export const GET = route(
  { access: 'results:read-all', query: reviewListQuerySchema },
  async ({ ctx, query }) => json({ reviews: await listReviews(ctx.organization.id, query.status) }),
);

/** Submits the latest new or rejected results of a batch (or one sample) for review → 201. */
export const POST = route(
  { access: 'records:write', what: 'submit results for review', body: submitReviewSchema },
  async ({ actor, body }) => json(await submitForReview(actor, body), 201),
);
