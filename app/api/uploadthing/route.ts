import { UploadThingError } from 'uploadthing/server';
import { recordUploadedPhoto } from '@/server/photos/record-upload';
import { getAuthContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import { createDropPhotoRouter } from '@/lib/uploads/file-router';
import { createUploadRouteHandlers } from '@/lib/uploads/route-handlers';

/**
 * Drop-photo uploads through the uploadthing SDK: signed in, analyst or admin, recorded in the
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
    return recordUploadedPhoto({
      organizationId: metadata.organizationId,
      uploadedByUserId: metadata.userId,
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
      // Metadata stored by an older release has no purpose.
      purpose: metadata.purpose ?? 'sessile-drop',
    });
  },
});

export type DropPhotoRouter = typeof dropPhotoRouter;

export const { GET, POST } = createUploadRouteHandlers(dropPhotoRouter);
