import { tensiometryListQuerySchema, wilhelmySchema } from '@/lib/contracts/tensiometry';
import { json, route } from '@/server/http/route';
import { listSavedTensiometry } from '@/server/tensiometry/list';
import { wilhelmy } from '@/server/tensiometry/wilhelmy';

/**
 * Wilhelmy plate. Body: { mode: 'tension', forceMilliNewton, plateWidthMm, plateThicknessMm,
 * immersionDepthMm?, liquidDensityGPerCm3?, plateWeightMilliNewton?, contactAngleDeg? (0) } or
 * { mode: 'angle', …, liquidSurfaceTensionMilliNewtonPerM }; save?: true stores it with its
 * inputs → { result, saved? } (201 when saved).
 */
export const POST = route(
  { access: 'organization:read', body: wilhelmySchema },
  async ({ ctx, body }) => {
    const reply = await wilhelmy(ctx, body);
    return json(reply, reply.saved ? 201 : 200);
  },
);

/** Saved Wilhelmy results, newest first. Query: kind, limit. */
export const GET = route(
  { access: 'organization:read', query: tensiometryListQuerySchema },
  async ({ ctx, query }) =>
    json(
      await listSavedTensiometry(ctx.organization.id, {
        kinds: query.kind ? [query.kind] : ['wilhelmy-tension', 'wilhelmy-angle'],
        limit: query.limit,
      }),
    ),
);
