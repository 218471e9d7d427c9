import { archiveOrDeleteCoating, getCoating, updateCoating } from '@/db/queries/coatings';
import { route } from '@/lib/auth/guard';
import {
  archiveOrDeleteQuerySchema,
  coatingUpdateSchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

type Params = { params: Promise<{ id: string }> };

/** One coating → { coating }. */
export const GET = route<Params>('organization:read', async (_request, ctx, { params }) => {
  const { id } = await params;
  return Response.json({ coating: await getCoating(ctx.organization.id, id) });
});

/** Changes a coating (admins). Body: { version, code?, name?, description? } → { coating }. */
export const PATCH = route<Params>(
  'catalog:manage',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const input = await parseJsonBody(request, coatingUpdateSchema);
    const coating = await updateCoating(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      input,
    );
    return Response.json({ coating });
  },
  { what: 'change coatings' },
);

/**
 * Archives the coating when batches or specs are under it (or with ?mode=archive), else deletes
 * it. Optional ?version= refuses a stale delete. → { outcome: 'archived' | 'deleted', coating }.
 */
export const DELETE = route<Params>(
  'catalog:manage',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const options = parseSearchParams(
      archiveOrDeleteQuerySchema,
      new URL(request.url).searchParams,
    );
    const { outcome, record } = await archiveOrDeleteCoating(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      options,
    );
    return Response.json({ outcome, coating: record });
  },
  { what: 'archive or delete coatings' },
);
