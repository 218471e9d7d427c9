import { createBatch, listBatches } from '@/db/queries/batches';
import { route } from '@/lib/auth/guard';
import {
  batchCreateSchema,
  batchListQuerySchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

/** Batches of the organization. Query: coatingId, producedFrom, producedTo, q, includeArchived, sort, dir, page, pageSize. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(batchListQuerySchema, new URL(request.url).searchParams);
  return Response.json(await listBatches(ctx.organization.id, query));
});

/** Creates a batch (admins, analysts). Body: { coatingId, lotCode, producedOn, process?, notes? } → 201 { batch }. */
export const POST = route(
  'records:write',
  async (request, ctx) => {
    const input = await parseJsonBody(request, batchCreateSchema);
    const batch = await createBatch(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      input,
    );
    return Response.json({ batch }, { status: 201 });
  },
  { what: 'add batches' },
);
