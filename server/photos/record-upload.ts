import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { insertPhoto, type NewPhoto } from '@/db/queries/photos';
import type { InspectedImage } from '@/lib/uploads/inspect-image';
import { inTransaction } from '@/db/queries/transaction';

/** Keeps an accepted upload as a `photos` row with its audit row, in one transaction. */
export async function recordUploadedPhoto(input: NewPhoto): Promise<{ photoId: string }> {
  const photoId = newId();
  await inTransaction(async (tx) => {
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
  });
  return { photoId };
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
