import { getPhotoThumbnail } from '@/db/queries/photos';
import { notFound } from '@/lib/api/errors';
import { route } from '@/lib/auth/guard';

type Params = { params: Promise<{ id: string }> };

export const GET = route<Params>('results:read-all', async (_request, ctx, { params }) => {
  const { id } = await params;
  const thumbnail = await getPhotoThumbnail(ctx.organization.id, id);
  if (!thumbnail) throw notFound('That photo');
  return new Response(new Uint8Array(thumbnail.thumbnailPng), {
    headers: { 'content-type': 'image/png', 'cache-control': 'private, max-age=86400, immutable' },
  });
});
