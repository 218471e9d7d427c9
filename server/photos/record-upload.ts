import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import {
  findUnsavedTwin,
  insertPhoto,
  lockUploadsOf,
  restorePhoto,
  type NewPhoto,
} from '@/db/queries/photos';
import type { InspectedImage } from '@/lib/uploads/inspect-image';
import { inTransaction } from '@/db/queries/transaction';

/**
 * Keeps an accepted upload as a `photos` row with its audit row, in one transaction. With
 * `reuseUnsavedTwin` (workspace uploads), the same file uploaded again by the same user while it
 * is not saved to a sample is the photo already kept (put back in the workspace if it was
 * removed), never a second row; `reused` says so, and the caller removes the new stored file.
 */
export async function recordUploadedPhoto(
  input: NewPhoto,
  { reuseUnsavedTwin = false }: { reuseUnsavedTwin?: boolean } = {},
): Promise<{ photoId: string; reused?: boolean }> {
  return inTransaction(async (tx) => {
    if (reuseUnsavedTwin) {
      await lockUploadsOf(tx, input.uploadedByUserId, input.sha256);
      const twin = await findUnsavedTwin(tx, {
        organizationId: input.organizationId,
        userId: input.uploadedByUserId,
        sha256: input.sha256,
        purpose: input.purpose ?? 'sessile-drop',
      });
      if (twin) {
        if (twin.removedAt) await restorePhoto(tx, twin.id);
        return { photoId: twin.id, reused: true };
      }
    }
    const photoId = newId();
    await insertPhoto(tx, { id: photoId, ...input });
    await recordAudit(tx, {
      actorUserId: input.uploadedByUserId,
      organizationId: input.organizationId,
      action: 'photo.upload',
      entityType: 'photo',
      entityId: photoId,
      after: {
        name: input.originalName,
        purpose: input.purpose ?? 'sessile-drop',
        format: input.format,
        width: input.width,
        height: input.height,
        sha256: input.sha256,
      },
    });
    return { photoId };
  });
}

/** The photo row of a stored file whose bytes lib/uploads/inspect-image.ts accepted. */
export function inspectedPhotoRow(
  owner: { organizationId: string; userId: string },
  file: { key: string; url: string; name: string; size: number },
  inspected: InspectedImage,
  purpose: NonNullable<NewPhoto['purpose']>,
): NewPhoto {
  return {
    organizationId: owner.organizationId,
    uploadedByUserId: owner.userId,
    fileKey: file.key,
    url: file.url,
    originalName: file.name,
    sizeBytes: file.size,
    format: inspected.format,
    width: inspected.width,
    height: inspected.height,
    bitDepth: inspected.bitDepth,
    sha256: inspected.sha256,
    thumbnailPng: inspected.thumbnailPng,
    workingPng: inspected.orientedPng ?? null,
    purpose,
  };
}
