import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { markPhotosRemoved } from '@/db/queries/photos';
import { inTransaction } from '@/db/queries/transaction';
import { AppError } from '@/lib/app-error';
import type { RemovePhotosInput, RemovePhotosReply } from '@/lib/contracts/photos';
import type { Actor } from '../actor';

/**
 * Takes photos out of their uploader's measurement workspace: only their own photos that are
 * not saved to a sample. The rows stay (marked removed, audited); uploading the same file again
 * brings the photo back. All of them or none.
 */
export async function removeUnsavedPhotos(
  actor: Actor,
  input: RemovePhotosInput,
): Promise<RemovePhotosReply> {
  const photoIds = [...new Set(input.photoIds)];
  return inTransaction(async (tx) => {
    const removed = await markPhotosRemoved(tx, {
      organizationId: actor.organizationId,
      userId: actor.userId,
      photoIds,
    });
    if (removed.length !== photoIds.length) {
      const count = photoIds.length - removed.length;
      throw new AppError(
        'not_found',
        `${count} of these photos ${count === 1 ? 'is' : 'are'} not an unsaved photo of yours: saved to a sample (archive its drop instead) or uploaded by someone else. Nothing was removed; reload the page and try again.`,
        { fields: { photoIds: 'Choose unsaved photos you uploaded.' } },
      );
    }
    for (const photoId of removed) {
      await recordAudit(tx, {
        actorUserId: actor.userId,
        organizationId: actor.organizationId,
        action: 'photo.remove',
        entityType: 'photo',
        entityId: photoId,
      });
    }
    return { removed };
  });
}
