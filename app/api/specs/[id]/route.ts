import { archiveOrDeleteSpec, getSpec, updateSpec } from '@/db/queries/specs';
import { route } from '@/lib/auth/guard';
import {
  archiveOrDeleteQuerySchema,
  specUpdateSchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

type Params = { params: Promise<{ id: string }> };

/** One spec → { spec }. */
export const GET = route<Params>('organization:read', async (_request, ctx, { params }) => {
  const { id } = await params;
  return Response.json({ spec: await getSpec(ctx.organization.id, id) });
});

/** Changes a spec (admins). Body: { version, …any create field } → { spec }. */
export const PATCH = route<Params>(
  'catalog:manage',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const input = await parseJsonBody(request, specUpdateSchema);
    const spec = await updateSpec(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      input,
    );
    return Response.json({ spec });
  },
  { what: 'change specs' },
);

/** Deletes the spec (nothing refers to one), or archives it with ?mode=archive. Optional ?version=. → { outcome: 'archived' | 'deleted', spec }. */
export const DELETE = route<Params>(
  'catalog:manage',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const options = parseSearchParams(
      archiveOrDeleteQuerySchema,
      new URL(request.url).searchParams,
    );
    const { outcome, record } = await archiveOrDeleteSpec(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      options,
    );
    return Response.json({ outcome, spec: record });
  },
  { what: 'archive or delete specs' },
);
