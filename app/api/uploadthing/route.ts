import { UploadThingError } from 'uploadthing/server';
import { inspectedPhotoRow, recordUploadedPhoto } from '@/server/photos/record-upload';
import { recordUploadedVideo } from '@/server/dynamic/record-video';
import { getAuthContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import { createDropPhotoRouter } from '@/lib/uploads/file-router';
import { createUploadRouteHandlers } from '@/lib/uploads/route-handlers';

/**
 * Drop-photo and series-video uploads through the uploadthing SDK: signed in, analyst or admin, recorded in the
 * active organization. Each accepted photo becomes a `photos` row; a refused one leaves nothing.
 */
const dropPhotoRouter = createDropPhotoRouter({
  async authorize() {
    const ctx = await getAuthContext();
    if (!ctx?.organization) {
      throw new UploadThingError({
        code: 'FORBIDDEN',
        message: 'You are not signed in. Sign in and try again.',
      });
    }
    if (!can(ctx.organization.role, 'records:write')) {
      throw new UploadThingError({
        code: 'FORBIDDEN',
        message:
          'Your role in this organization does not allow uploading photos. Ask an admin if you need it.',
      });
    }
    return { userId: ctx.user.id, organizationId: ctx.organization.id };
  },
  async onStored(file, inspected, { metadata }) {
    // Metadata stored by an older release has no purpose.
    const purpose = metadata.purpose ?? 'sessile-drop';
    // The workspace keeps one photo per file and user: the same file again is that photo.
    return recordUploadedPhoto(inspectedPhotoRow(metadata, file, inspected, purpose), {
      reuseUnsavedTwin: purpose === 'sessile-drop',
    });
  },
  async onVideoStored(file, owner) {
    const { videoId, info } = await recordUploadedVideo(owner, file);
    return {
      status: 'stored',
      videoId,
      fps: info.fps,
      frameCount: info.frameCount,
      width: info.width,
      height: info.height,
    };
  },
});

export type DropPhotoRouter = typeof dropPhotoRouter;

export const { GET, POST } = createUploadRouteHandlers(dropPhotoRouter);
