import { listReviews, submitForReview } from '@/db/queries/reviews';
import { route } from '@/lib/auth/guard';
import { submitReviewSchema } from '@/lib/validation/reviews';

/** Reviews of the organization; ?status=submitted for the queue, ?status=decided for the history. */
export const GET = route('results:read-all', async (request, ctx) => {
  const status = new URL(request.url).searchParams.get('status');
  const reviews = await listReviews(
    ctx.organization.id,
    status === 'submitted' || status === 'decided' ? status : undefined,
  );
  return Response.json({ reviews });
});

/** Submits the latest new or rejected results of a batch (or one sample) for review. */
export const POST = route(
  'records:write',
  async (request, ctx) => {
    const body = submitReviewSchema.parse(await request.json().catch(() => ({})));
    const submitted = await submitForReview({
      organizationId: ctx.organization.id,
      userId: ctx.user.id,
      batchId: body.batchId,
      sampleId: body.sampleId ?? null,
      note: body.note,
    });
    return Response.json(submitted, { status: 201 });
  },
  { what: 'submit results for review' },
);
