import {
  archiveOrDeleteProbeLiquid,
  getProbeLiquid,
  updateProbeLiquid,
} from '@/db/queries/probe-liquids';
import { route } from '@/lib/auth/guard';
import {
  archiveOrDeleteQuerySchema,
  probeLiquidUpdateSchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

type Params = { params: Promise<{ id: string }> };

/** One probe liquid → { probeLiquid }. */
export const GET = route<Params>('organization:read', async (_request, ctx, { params }) => {
  const { id } = await params;
  return Response.json({ probeLiquid: await getProbeLiquid(ctx.organization.id, id) });
});

/** Changes one of the organization’s own probe liquids (built-ins: 403 read_only). Body: { version, …any create field } → { probeLiquid }. */
export const PATCH = route<Params>(
  'catalog:manage',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const input = await parseJsonBody(request, probeLiquidUpdateSchema);
    const probeLiquid = await updateProbeLiquid(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      input,
    );
    return Response.json({ probeLiquid });
  },
  { what: 'change probe liquids' },
);

/** Archives the liquid when specs, sessions or drops refer to it (or with ?mode=archive), else deletes it; built-ins: 403. Optional ?version=. → { outcome: 'archived' | 'deleted', probeLiquid }. */
export const DELETE = route<Params>(
  'catalog:manage',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const options = parseSearchParams(
      archiveOrDeleteQuerySchema,
      new URL(request.url).searchParams,
    );
    const { outcome, record } = await archiveOrDeleteProbeLiquid(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      options,
    );
    return Response.json({ outcome, probeLiquid: record });
  },
  { what: 'archive or delete probe liquids' },
);
