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
import { inTransaction } from '@/db/queries/transaction';

/**
 * Keeps an accepted upload as a `photos` row with its audit row, in one transaction. The same
 * file uploaded again by the same user while it is not saved to a sample is the photo already
 * kept (put back in the workspace if it was removed), never a second row.
 */
export async function recordUploadedPhoto(input: NewPhoto): Promise<{ photoId: string }> {
  const purpose = input.purpose ?? 'sessile-drop';
  return inTransaction(async (tx) => {
    await lockUploadsOf(tx, input.uploadedByUserId, input.sha256);
    const twin = await findUnsavedTwin(tx, {
      organizationId: input.organizationId,
      userId: input.uploadedByUserId,
      sha256: input.sha256,
      purpose,
    });
    if (twin) {
      if (twin.removedAt) await restorePhoto(tx, twin.id);
      return { photoId: twin.id };
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
        purpose,
        format: input.format,
        width: input.width,
        height: input.height,
        sha256: input.sha256,
      },
    });
    return { photoId };
  });
}
