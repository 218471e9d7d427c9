import { z } from 'zod';
import { parsePendantDropBody, tensiometryListQuerySchema } from '@/lib/contracts/tensiometry';
import { json, route } from '@/server/http/route';
import { listSavedTensiometry } from '@/server/tensiometry/list';
import { pendantDrop } from '@/server/tensiometry/pendant-drop';

/**
 * Pendant-drop surface tension by a Young–Laplace fit of the hanging drop's outline.
 *
 * Body, either
 * - { photoId, needleOuterDiameterMm, densityDifferenceKgPerM3, save? }: a photo uploaded through
 *   the 'dropPhoto' upload route; the server finds the outline and the needle's width in it and
 *   answers { result, photo: { id, width, height }, extraction: { pointCount,
 *   needleOuterDiameterPx, needleTipY, warnings }, profile: [{ x, y }] (the fitted outline, px),
 *   saved? }; a saved result keeps the photo;
 * - { edge: [{ x, y }] (px, y downward), needleOuterDiameterMm, needleOuterDiameterPx,
 *   densityDifferenceKgPerM3, save? } → { result, saved? }.
 * result: { surfaceTensionMilliNewtonPerM, shapeFactor, apexRadiusMm, rmsResidualPx, warnings, … }.
 */
export const POST = route(
  {
    access: 'organization:read',
    body: z.record(z.string(), z.unknown()).transform(parsePendantDropBody),
    // An outline of up to 20 000 points.
    maxBodyBytes: 2 * 1024 * 1024,
  },
  async ({ ctx, body }) => {
    const reply = await pendantDrop(ctx, body);
    return json(reply, reply.saved ? 201 : 200);
  },
);

/** Saved pendant-drop results (with their photoId, if fitted from a photo), newest first. Query: limit. */
export const GET = route(
  { access: 'organization:read', query: tensiometryListQuerySchema },
  async ({ ctx, query }) =>
    json(
      await listSavedTensiometry(ctx.organization.id, {
        kinds: ['pendant-drop'],
        limit: query.limit,
      }),
    ),
);
