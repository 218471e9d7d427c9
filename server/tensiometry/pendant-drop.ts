import 'server-only';
import { forbidden } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import type { PendantDropBody, PendantDropResponse } from '@/lib/contracts/tensiometry';
import { runCompute } from '../compute/pool';
import { loadPhotoGray } from '../photos/pixels';
import { assertMaySave, calculateInPool, replyAndMaybeSave } from './calculate';

/** From an uploaded photo: the server finds the outline and the needle's width, then fits. */
async function fitFromPhoto(
  ctx: OrgContext,
  input: Extract<PendantDropBody, { source: 'photo' }>,
): Promise<PendantDropResponse> {
  // Drop photos are readable by those who read every result (as /api/photos/[id]/image).
  if (!can(ctx.organization.role, 'results:read-all')) throw forbidden('fit drop photos');
  const { photoId, needleOuterDiameterMm, densityDifferenceKgPerM3, save } = input;
  const image = await loadPhotoGray(ctx.organization.id, photoId);
  // Outline, needle, fit and the drawn profile in one task of the compute pool.
  const { extraction, result, profile } = await calculateInPool(() =>
    runCompute(ctx.user.id, {
      kind: 'pendant-photo',
      image,
      needleOuterDiameterMm,
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
      profile,
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
  const result = await calculateInPool(() =>
    runCompute(ctx.user.id, { kind: 'pendant-fit', input: inputs }),
  );
  return replyAndMaybeSave(ctx, { save, kind: 'pendant-drop', inputs, result, outputs: result });
}
