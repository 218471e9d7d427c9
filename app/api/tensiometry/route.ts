import { tensiometryListQuerySchema } from '@/lib/contracts/tensiometry';
import { json, route } from '@/server/http/route';
import { listSavedTensiometry } from '@/server/tensiometry/list';

/** All saved tensiometry results, newest first. Query: kind, limit → { items }. */
export const GET = route(
  { access: 'organization:read', query: tensiometryListQuerySchema },
  async ({ ctx, query }) =>
    json(
      await listSavedTensiometry(ctx.organization.id, {
        kinds: query.kind ? [query.kind] : undefined,
        limit: query.limit,
      }),
    ),
);
