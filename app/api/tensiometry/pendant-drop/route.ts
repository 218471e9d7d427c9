import { z } from 'zod';
import { listTensiometryResults, saveTensiometryResult } from '@/db/queries/tensiometry';
import { DecodeError } from '@/lib/analysis/node/decode';
import { HttpError, forbidden } from '@/lib/api/errors';
import { route } from '@/lib/auth/guard';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import { loadPhotoGray } from '@/lib/measure/photo-pixels';
import {
  fitPendantDrop,
  fittedPendantOutline,
  pendantEdgeFromImage,
} from '@/lib/tensiometry/pendant-drop';
import { parseJsonBody, parseSearchParams } from '@/lib/validation/records';
import {
  parsePendantDropBody,
  tensiometryListQuerySchema,
  type PendantDropBody,
} from '@/lib/validation/tensiometry';
import { assertMaySave, calculate } from '../errors';

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
export const POST = route('organization:read', async (request, ctx) => {
  const input = parsePendantDropBody(
    await parseJsonBody(request, z.record(z.string(), z.unknown())),
  );
  assertMaySave(ctx, input.save);
  if (input.source === 'photo') return fitPhoto(ctx, input);
  const { source: _source, save, ...inputs } = input;
  const result = calculate(() => fitPendantDrop(inputs));
  if (!save) return Response.json({ result });
  const saved = await saveTensiometryResult(
    { organizationId: ctx.organization.id, userId: ctx.user.id },
    'pendant-drop',
    inputs,
    { ...result },
  );
  return Response.json({ result, saved }, { status: 201 });
});

async function fitPhoto(ctx: OrgContext, input: Extract<PendantDropBody, { source: 'photo' }>) {
  // Drop photos are readable by those who read every result (as /api/photos/[id]/image).
  if (!can(ctx.organization.role, 'results:read-all')) throw forbidden('fit drop photos');
  const { photoId, needleOuterDiameterMm, densityDifferenceKgPerM3, save } = input;
  let image;
  try {
    image = await loadPhotoGray(ctx.organization.id, photoId);
  } catch (error) {
    if (error instanceof DecodeError) {
      throw new HttpError(
        422,
        'unreadable_photo',
        'The stored photo could not be decoded; upload it again as PNG or JPEG.',
        {
          photoId: 'The stored photo could not be decoded; upload it again as PNG or JPEG.',
        },
      );
    }
    throw error;
  }
  const extraction = calculate(() => pendantEdgeFromImage(image));
  const result = calculate(() =>
    fitPendantDrop({
      edge: extraction.edge,
      needleOuterDiameterMm,
      needleOuterDiameterPx: extraction.needleOuterDiameterPx,
      densityDifferenceKgPerM3,
    }),
  );
  const found = {
    pointCount: extraction.edge.length,
    needleOuterDiameterPx: extraction.needleOuterDiameterPx,
    needleTipY: extraction.needleTipY,
    warnings: extraction.warnings,
  };
  const body = {
    result,
    photo: { id: photoId, width: image.width, height: image.height },
    extraction: found,
    profile: fittedPendantOutline(result, extraction.needleTipY),
  };
  if (!save) return Response.json(body);
  const saved = await saveTensiometryResult(
    { organizationId: ctx.organization.id, userId: ctx.user.id },
    'pendant-drop',
    { photoId, needleOuterDiameterMm, densityDifferenceKgPerM3 },
    { ...result, extraction: found },
    { photoId },
  );
  return Response.json({ ...body, saved }, { status: 201 });
}

/** Saved pendant-drop results (with their photoId, if fitted from a photo), newest first. Query: limit. */
export const GET = route('organization:read', async (request, ctx) => {
  const query = parseSearchParams(tensiometryListQuerySchema, new URL(request.url).searchParams);
  return Response.json({
    items: await listTensiometryResults(ctx.organization.id, {
      kinds: ['pendant-drop'],
      limit: query.limit,
    }),
  });
});
