import {
  archiveOrDeleteMeasurementSession,
  getMeasurementSession,
  updateMeasurementSession,
} from '@/db/queries/measurement-sessions';
import { route } from '@/lib/auth/guard';
import {
  archiveOrDeleteQuerySchema,
  measurementSessionUpdateSchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

type Params = { params: Promise<{ id: string }> };

/** One measurement session → { measurementSession }. */
export const GET = route<Params>('organization:read', async (_request, ctx, { params }) => {
  const { id } = await params;
  return Response.json({
    measurementSession: await getMeasurementSession(ctx.organization.id, id),
  });
});

/** Changes a measurement session. Body: { version, …any create field } → { measurementSession }. */
export const PATCH = route<Params>(
  'records:write',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const input = await parseJsonBody(request, measurementSessionUpdateSchema);
    const measurementSession = await updateMeasurementSession(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      input,
    );
    return Response.json({ measurementSession });
  },
  { what: 'change measurement sessions' },
);

/** Archives the session when drops are under it (or with ?mode=archive), else deletes it. Optional ?version=. → { outcome: 'archived' | 'deleted', measurementSession }. */
export const DELETE = route<Params>(
  'records:write',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const options = parseSearchParams(
      archiveOrDeleteQuerySchema,
      new URL(request.url).searchParams,
    );
    const { outcome, record } = await archiveOrDeleteMeasurementSession(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      options,
    );
    return Response.json({ outcome, measurementSession: record });
  },
  { what: 'archive or delete measurement sessions' },
);
