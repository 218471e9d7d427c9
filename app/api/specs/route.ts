import { createSpec, listSpecs } from '@/db/queries/specs';
import { route } from '@/lib/auth/guard';
import {
  specCreateSchema,
  specListQuerySchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

/** Specs of the organization. Query: coatingId, probeLiquidId, q, includeArchived, sort, dir, page, pageSize. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(specListQuerySchema, new URL(request.url).searchParams);
  return Response.json(await listSpecs(ctx.organization.id, query));
});

/** Creates a spec (admins). Body: { coatingId, probeLiquidId, scope, minDeg?, maxDeg?, minSurfaceEnergyMnM?, maxSurfaceEnergyMnM?, maxDaysSinceTreatment?, note? } → 201 { spec }. */
export const POST = route(
  'catalog:manage',
  async (request, ctx) => {
    const input = await parseJsonBody(request, specCreateSchema);
    const spec = await createSpec(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      input,
    );
    return Response.json({ spec }, { status: 201 });
  },
  { what: 'add specs' },
);
