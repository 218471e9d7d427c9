import { tensiometryListQuerySchema, waterCheckSchema } from '@/lib/contracts/tensiometry';
import { json, route } from '@/server/http/route';
import { listSavedTensiometry } from '@/server/tensiometry/list';
import { checkWater } from '@/server/tensiometry/water-check';

/**
 * Probe-liquid check: a measured water surface tension against IAPWS R1-76(2014) at the
 * measured temperature. Body: { measuredMilliNewtonPerM, temperatureC, toleranceMilliNewtonPerM?
 * (1.0), save? } → { result: { referenceMilliNewtonPerM, deviationMilliNewtonPerM, flag, message,
 * … }, saved? } (201 when saved).
 */
export const POST = route(
  { access: 'organization:read', body: waterCheckSchema },
  async ({ ctx, body }) => {
    const reply = await checkWater(ctx, body);
    return json(reply, reply.saved ? 201 : 200);
  },
);

/** Saved water checks, newest first. Query: limit. */
export const GET = route(
  { access: 'organization:read', query: tensiometryListQuerySchema },
  async ({ ctx, query }) =>
    json(
      await listSavedTensiometry(ctx.organization.id, {
        kinds: ['water-check'],
        limit: query.limit,
      }),
    ),
);
