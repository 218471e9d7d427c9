import { route } from '@/lib/auth/guard';
import { loadPhotoBytes } from '@/lib/measure/photo-pixels';

type Params = { params: Promise<{ id: string }> };

/** The photo for the workspace canvas and worker, same-origin so canvases stay readable. */
export const GET = route<Params>('results:read-all', async (_request, ctx, { params }) => {
  const { id } = await params;
  const { bytes, contentType } = await loadPhotoBytes(ctx.organization.id, id);
  return new Response(new Uint8Array(bytes), {
    headers: { 'content-type': contentType, 'cache-control': 'private, max-age=86400, immutable' },
  });
});
