import { archiveOrDeleteBatch, getBatch, updateBatch } from '@/db/queries/batches';
import { route } from '@/lib/auth/guard';
import {
  archiveOrDeleteQuerySchema,
  batchUpdateSchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

type Params = { params: Promise<{ id: string }> };

/** One batch → { batch }. */
export const GET = route<Params>('organization:read', async (_request, ctx, { params }) => {
  const { id } = await params;
  return Response.json({ batch: await getBatch(ctx.organization.id, id) });
});

/** Changes a batch. Body: { version, …any create field } (process replaces the stored parameters) → { batch }. */
export const PATCH = route<Params>(
  'records:write',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const input = await parseJsonBody(request, batchUpdateSchema);
    const batch = await updateBatch(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      input,
    );
    return Response.json({ batch });
  },
  { what: 'change batches' },
);

/** Archives the batch when samples are under it (or with ?mode=archive), else deletes it. Optional ?version=. → { outcome: 'archived' | 'deleted', batch }. */
export const DELETE = route<Params>(
  'records:write',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const options = parseSearchParams(
      archiveOrDeleteQuerySchema,
      new URL(request.url).searchParams,
    );
    const { outcome, record } = await archiveOrDeleteBatch(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      options,
    );
    return Response.json({ outcome, batch: record });
  },
  { what: 'archive or delete batches' },
);
