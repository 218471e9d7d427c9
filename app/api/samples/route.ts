import { createSample, listSamples } from '@/db/queries/samples';
import { route } from '@/lib/auth/guard';
import {
  sampleCreateSchema,
  sampleListQuerySchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

/** Samples of the organization. Query: batchId, coatingId, q, includeArchived, sort, dir, page, pageSize. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(sampleListQuerySchema, new URL(request.url).searchParams);
  return Response.json(await listSamples(ctx.organization.id, query));
});

/** Creates a sample (admins, analysts). Body: { batchId, label, substrate?, position?, treatedAt?, notes? } → 201 { sample }. */
export const POST = route(
  'records:write',
  async (request, ctx) => {
    const input = await parseJsonBody(request, sampleCreateSchema);
    const sample = await createSample(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      input,
    );
    return Response.json({ sample }, { status: 201 });
  },
  { what: 'add samples' },
);
