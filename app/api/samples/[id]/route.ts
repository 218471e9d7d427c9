import { archiveOrDeleteSample, getSample, updateSample } from '@/db/queries/samples';
import { route } from '@/lib/auth/guard';
import {
  archiveOrDeleteQuerySchema,
  sampleUpdateSchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

type Params = { params: Promise<{ id: string }> };

/** One sample → { sample }. */
export const GET = route<Params>('organization:read', async (_request, ctx, { params }) => {
  const { id } = await params;
  return Response.json({ sample: await getSample(ctx.organization.id, id) });
});

/** Changes a sample. Body: { version, …any create field } → { sample }. */
export const PATCH = route<Params>(
  'records:write',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const input = await parseJsonBody(request, sampleUpdateSchema);
    const sample = await updateSample(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      input,
    );
    return Response.json({ sample });
  },
  { what: 'change samples' },
);

/** Archives the sample when drops are under it (or with ?mode=archive), else deletes it. Optional ?version=. → { outcome: 'archived' | 'deleted', sample }. */
export const DELETE = route<Params>(
  'records:write',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const options = parseSearchParams(
      archiveOrDeleteQuerySchema,
      new URL(request.url).searchParams,
    );
    const { outcome, record } = await archiveOrDeleteSample(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      options,
    );
    return Response.json({ outcome, sample: record });
  },
  { what: 'archive or delete samples' },
);
