import { listTensiometryResults, saveTensiometryResult } from '@/db/queries/tensiometry';
import { route } from '@/lib/auth/guard';
import { wilhelmyContactAngle, wilhelmySurfaceTension } from '@/lib/tensiometry';
import { parseJsonBody, parseSearchParams } from '@/lib/validation/records';
import { tensiometryListQuerySchema, wilhelmySchema } from '@/lib/validation/tensiometry';
import { assertMaySave, calculate } from '../errors';

/**
 * Wilhelmy plate. Body: { mode: 'tension', forceMilliNewton, plateWidthMm, plateThicknessMm,
 * immersionDepthMm?, liquidDensityGPerCm3?, plateWeightMilliNewton?, contactAngleDeg? (0) } or
 * { mode: 'angle', …, liquidSurfaceTensionMilliNewtonPerM }; save?: true stores it with its
 * inputs → { result, saved? }.
 */
export const POST = route('organization:read', async (request, ctx) => {
  const input = await parseJsonBody(request, wilhelmySchema);
  assertMaySave(ctx, input.save);
  const reading = {
    plate: { widthMm: input.plateWidthMm, thicknessMm: input.plateThicknessMm },
    forceMilliNewton: input.forceMilliNewton,
    plateWeightMilliNewton: input.plateWeightMilliNewton,
    immersionDepthMm: input.immersionDepthMm,
    liquidDensityGPerCm3: input.liquidDensityGPerCm3,
  };
  const result = calculate(() =>
    input.mode === 'tension'
      ? wilhelmySurfaceTension(reading, { contactAngleDeg: input.contactAngleDeg })
      : wilhelmyContactAngle(reading, input.liquidSurfaceTensionMilliNewtonPerM),
  );
  const { save, ...inputs } = input;
  if (!save) return Response.json({ result });
  const saved = await saveTensiometryResult(
    { organizationId: ctx.organization.id, userId: ctx.user.id },
    input.mode === 'tension' ? 'wilhelmy-tension' : 'wilhelmy-angle',
    inputs,
    { ...result },
  );
  return Response.json({ result, saved }, { status: 201 });
});

/** Saved Wilhelmy results, newest first. Query: limit. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(tensiometryListQuerySchema, new URL(request.url).searchParams);
  const kinds = query.kind ? [query.kind] : (['wilhelmy-tension', 'wilhelmy-angle'] as const);
  return Response.json({
    items: await listTensiometryResults(ctx.organization.id, { kinds, limit: query.limit }),
  });
});
