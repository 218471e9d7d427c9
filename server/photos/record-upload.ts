import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { insertPhoto, type NewPhoto } from '@/db/queries/photos';
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
