import 'server-only';
import { DecodeError } from '@/lib/analysis/node/decode';
import type { GrayImage } from '@/lib/analysis/types';
import { AppError, forbidden } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import type { PendantDropBody, PendantDropResponse } from '@/lib/contracts/tensiometry';
import {
  fitPendantDrop,
  fittedPendantOutline,
  pendantEdgeFromImage,
} from '@/lib/tensiometry/pendant-drop';
import { loadPhotoGray } from '../photos/pixels';
import { assertMaySave, calculate, replyAndMaybeSave } from './calculate';

const UNREADABLE = 'The stored photo could not be decoded; upload it again as PNG or JPEG.';

async function photoPixels(organizationId: string, photoId: string): Promise<GrayImage> {
  try {
    return await loadPhotoGray(organizationId, photoId);
  } catch (error) {
    if (error instanceof DecodeError) {
      throw new AppError('unreadable_photo', UNREADABLE, { fields: { photoId: UNREADABLE } });
    }
    throw error;
  }
}

/** From an uploaded photo: the server finds the outline and the needle's width, then fits. */
async function fitFromPhoto(
  ctx: OrgContext,
  input: Extract<PendantDropBody, { source: 'photo' }>,
): Promise<PendantDropResponse> {
  // Drop photos are readable by those who read every result (as /api/photos/[id]/image).
  if (!can(ctx.organization.role, 'results:read-all')) throw forbidden('fit drop photos');
  const { photoId, needleOuterDiameterMm, densityDifferenceKgPerM3, save } = input;
  const image = await photoPixels(ctx.organization.id, photoId);
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
  return replyAndMaybeSave(ctx, {
    save,
    kind: 'pendant-drop',
    inputs: { photoId, needleOuterDiameterMm, densityDifferenceKgPerM3 },
    result,
    outputs: { ...result, extraction: found },
    photoId,
    extra: {
      photo: { id: photoId, width: image.width, height: image.height },
      extraction: found,
      profile: fittedPendantOutline(result, extraction.needleTipY),
    },
  });
}

/**
 * Pendant-drop surface tension by a Young–Laplace fit of the hanging drop's outline: from an
 * uploaded photo, or from an outline (px) the caller traced; saved on request.
 */
export async function pendantDrop(
  ctx: OrgContext,
  input: PendantDropBody,
): Promise<PendantDropResponse> {
  assertMaySave(ctx, input.save);
  if (input.source === 'photo') return fitFromPhoto(ctx, input);
  const { source: _source, save, ...inputs } = input;
  const result = calculate(() => fitPendantDrop(inputs));
  return replyAndMaybeSave(ctx, { save, kind: 'pendant-drop', inputs, result, outputs: result });
}
