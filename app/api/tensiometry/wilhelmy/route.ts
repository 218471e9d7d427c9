import { wilhelmySchema } from '@/lib/contracts/tensiometry';
import { tensiometryRoutes } from '@/server/http/tensiometry-routes';
import { wilhelmy } from '@/server/tensiometry/wilhelmy';

/**
 * Wilhelmy plate. POST body: { mode: 'tension', forceMilliNewton, plateWidthMm,
 * plateThicknessMm, immersionDepthMm?, liquidDensityGPerCm3?, plateWeightMilliNewton?,
 * contactAngleDeg? (0) } or { mode: 'angle', …, liquidSurfaceTensionMilliNewtonPerM }; save?: true
 * stores it with its inputs → { result, saved? }. GET: the saved results (query: kind, limit).
 */
export const { POST, GET } = tensiometryRoutes({
  body: wilhelmySchema,
  kinds: ['wilhelmy-tension', 'wilhelmy-angle'],
  compute: wilhelmy,
});
