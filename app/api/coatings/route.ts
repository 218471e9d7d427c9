import { createCoating, listCoatings } from '@/db/queries/coatings';
import { route } from '@/lib/auth/guard';
import {
  coatingCreateSchema,
  coatingListQuerySchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

/** Coatings of the organization. Query: q, includeArchived, sort, dir, page, pageSize. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(coatingListQuerySchema, new URL(request.url).searchParams);
  return Response.json(await listCoatings(ctx.organization.id, query));
});

/** Creates a coating (admins). Body: { code, name, description? } → 201 { coating }. */
export const POST = route(
  'catalog:manage',
  async (request, ctx) => {
    const input = await parseJsonBody(request, coatingCreateSchema);
    const coating = await createCoating(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      input,
    );
    return Response.json({ coating }, { status: 201 });
  },
  { what: 'add coatings' },
);
