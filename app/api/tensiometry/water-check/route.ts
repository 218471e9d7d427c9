import { listTensiometryResults, saveTensiometryResult } from '@/db/queries/tensiometry';
import { route } from '@/lib/auth/guard';
import { checkWaterProbe } from '@/lib/tensiometry';
import { parseJsonBody, parseSearchParams } from '@/lib/validation/records';
import { tensiometryListQuerySchema, waterCheckSchema } from '@/lib/validation/tensiometry';
import { assertMaySave, calculate } from '../errors';

/**
 * Probe-liquid check: a measured water surface tension against IAPWS R1-76(2014) at the
 * measured temperature. Body: { measuredMilliNewtonPerM, temperatureC, toleranceMilliNewtonPerM?
 * (1.0), save? } → { result: { referenceMilliNewtonPerM, deviationMilliNewtonPerM, flag, message, … }, saved? }.
 */
export const POST = route('organization:read', async (request, ctx) => {
  const input = await parseJsonBody(request, waterCheckSchema);
  assertMaySave(ctx, input.save);
  const result = calculate(() =>
    checkWaterProbe(input.measuredMilliNewtonPerM, input.temperatureC, {
      toleranceMilliNewtonPerM: input.toleranceMilliNewtonPerM,
    }),
  );
  const { save, ...inputs } = input;
  if (!save) return Response.json({ result });
  const saved = await saveTensiometryResult(
    { organizationId: ctx.organization.id, userId: ctx.user.id },
    'water-check',
    inputs,
    { ...result, reference: 'IAPWS R1-76(2014)' },
  );
  return Response.json({ result, saved }, { status: 201 });
});

/** Saved water checks, newest first. Query: limit. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(tensiometryListQuerySchema, new URL(request.url).searchParams);
  return Response.json({
    items: await listTensiometryResults(ctx.organization.id, {
      kinds: ['water-check'],
      limit: query.limit,
    }),
  });
});
