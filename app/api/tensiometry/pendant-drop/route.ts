import { listTensiometryResults, saveTensiometryResult } from '@/db/queries/tensiometry';
import { route } from '@/lib/auth/guard';
import { fitPendantDrop } from '@/lib/tensiometry/pendant-drop';
import { parseJsonBody, parseSearchParams } from '@/lib/validation/records';
import { pendantDropSchema, tensiometryListQuerySchema } from '@/lib/validation/tensiometry';
import { assertMaySave, calculate } from '../errors';

/**
 * Pendant-drop surface tension by a Young–Laplace fit of the hanging drop's edge.
 * Body: { edge: [{ x, y }] (px, y downward), needleOuterDiameterMm, needleOuterDiameterPx,
 * densityDifferenceKgPerM3, save? } → { result: { surfaceTensionMilliNewtonPerM, shapeFactor,
 * apexRadiusMm, rmsResidualPx, warnings, … }, saved? }.
 */
export const POST = route('organization:read', async (request, ctx) => {
  const input = await parseJsonBody(request, pendantDropSchema);
  assertMaySave(ctx, input.save);
  const result = calculate(() => fitPendantDrop(input));
  const { save, ...inputs } = input;
  if (!save) return Response.json({ result });
  const saved = await saveTensiometryResult(
    { organizationId: ctx.organization.id, userId: ctx.user.id },
    'pendant-drop',
    inputs,
    { ...result },
  );
  return Response.json({ result, saved }, { status: 201 });
});

/** Saved pendant-drop results, newest first. Query: limit. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(tensiometryListQuerySchema, new URL(request.url).searchParams);
  return Response.json({
    items: await listTensiometryResults(ctx.organization.id, {
      kinds: ['pendant-drop'],
      limit: query.limit,
    }),
  });
});
