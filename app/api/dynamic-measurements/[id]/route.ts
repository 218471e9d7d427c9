import { idParamsSchema } from '@/lib/contracts/common';
import { loadDynamicMeasurement } from '@/server/dynamic/load';
import { json, route } from '@/server/http/route';

/** A dynamic measurement with its revisions (newest first) and the newest result and series. */
export const GET = route(
  { access: 'results:read-all', params: idParamsSchema },
  async ({ ctx, params }) => json(await loadDynamicMeasurement(ctx.organization.id, params.id)),
);
