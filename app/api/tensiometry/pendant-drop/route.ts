import { z } from 'zod';
import { parsePendantDropBody } from '@/lib/contracts/tensiometry';
import { tensiometryRoutes } from '@/server/http/tensiometry-routes';
import { pendantDrop } from '@/server/tensiometry/pendant-drop';

/**
 * Pendant-drop surface tension by a Young–Laplace fit of the hanging drop's outline.
 *
 * POST body, either
 * - { photoId, needleOuterDiameterMm, densityDifferenceKgPerM3, save? }: a photo uploaded through
 *   the 'dropPhoto' upload route; the server finds the outline and the needle's width in it and
 *   answers { result, photo: { id, width, height }, extraction: { pointCount,
 *   needleOuterDiameterPx, needleTipY, warnings }, profile: [{ x, y }] (the fitted outline, px),
 *   saved? }; a saved result keeps the photo;
 * - { edge: [{ x, y }] (px, y downward), needleOuterDiameterMm, needleOuterDiameterPx,
 *   densityDifferenceKgPerM3, save? } → { result, saved? }.
 * result: { surfaceTensionMilliNewtonPerM, shapeFactor, apexRadiusMm, rmsResidualPx, warnings, … }.
 * GET: the saved results, with their photoId when fitted from a photo (query: limit).
 */
export const { POST, GET } = tensiometryRoutes({
  body: z.record(z.string(), z.unknown()).transform(parsePendantDropBody),
  // An outline of up to 20 000 points.
  maxBodyBytes: 2 * 1024 * 1024,
  kinds: ['pendant-drop'],
  compute: pendantDrop,
});
