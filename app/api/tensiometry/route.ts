import { listTensiometryResults } from '@/db/queries/tensiometry';
import { route } from '@/lib/auth/guard';
import { parseSearchParams } from '@/lib/validation/records';
import { tensiometryListQuerySchema } from '@/lib/validation/tensiometry';

/** All saved tensiometry results, newest first. Query: kind, limit → { items }. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(tensiometryListQuerySchema, new URL(request.url).searchParams);
  return Response.json({
    items: await listTensiometryResults(ctx.organization.id, {
      kinds: query.kind ? [query.kind] : undefined,
      limit: query.limit,
    }),
  });
});
