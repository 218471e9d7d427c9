import { createProbeLiquid, listProbeLiquids } from '@/db/queries/probe-liquids';
import { route } from '@/lib/auth/guard';
import {
  probeLiquidCreateSchema,
  probeLiquidListQuerySchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

/** The built-in probe-liquid library and the organization’s own liquids. Query: origin (all, built-in, own), q, includeArchived, sort, dir, page, pageSize. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(probeLiquidListQuerySchema, new URL(request.url).searchParams);
  return Response.json(await listProbeLiquids(ctx.organization.id, query));
});

/** Adds one of the organization’s own probe liquids (admins). Body: { name, totalMnM, dispersiveMnM?, polarMnM?, lifshitzVanDerWaalsMnM?, acidMnM?, baseMnM?, densityGPerCm3?, sources?, hazardNote? } → 201 { probeLiquid }. */
export const POST = route(
  'catalog:manage',
  async (request, ctx) => {
    const input = await parseJsonBody(request, probeLiquidCreateSchema);
    const probeLiquid = await createProbeLiquid(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      input,
    );
    return Response.json({ probeLiquid }, { status: 201 });
  },
  { what: 'add probe liquids' },
);
