import {
  createMeasurementSession,
  listMeasurementSessions,
} from '@/db/queries/measurement-sessions';
import { route } from '@/lib/auth/guard';
import {
  measurementSessionCreateSchema,
  measurementSessionListQuerySchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';

/** Measurement sessions of the organization. Query: probeLiquidId, measuredFrom, measuredTo, q, includeArchived, sort, dir, page, pageSize. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(
    measurementSessionListQuerySchema,
    new URL(request.url).searchParams,
  );
  return Response.json(await listMeasurementSessions(ctx.organization.id, query));
});

/** Creates a measurement session (admins, analysts). Body: { operatorName, measuredAt, probeLiquidId?, temperatureC, humidityPct, dropVolumeUl, scalePxPerMm, instrumentNotes? } → 201 { measurementSession }. */
export const POST = route(
  'records:write',
  async (request, ctx) => {
    const input = await parseJsonBody(request, measurementSessionCreateSchema);
    const measurementSession = await createMeasurementSession(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      input,
    );
    return Response.json({ measurementSession }, { status: 201 });
  },
  { what: 'add measurement sessions' },
);
