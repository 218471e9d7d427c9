import { route } from '@/lib/auth/guard';
import { loadPhotoGrayPixels } from '@/lib/measure/photo-pixels';

type Params = { params: Promise<{ id: string }> };

/**
 * The photo's canonical gray pixels for the analysis worker: decoded on the server exactly as the
 * server decodes them to save an analysis, so the browser and the server analyse the same samples
 * (lib/analysis/gray-pixels.ts), gzip-compressed (the worker inflates them; a Content-Encoding
 * header would be dropped on the way by the server's own compression layer).
 */
export const GET = route<Params>('results:read-all', async (_request, ctx, { params }) => {
  const { id } = await params;
  const body = await loadPhotoGrayPixels(ctx.organization.id, id);
  return new Response(new Uint8Array(body), {
    headers: {
      'content-type': 'application/gzip',
      'cache-control': 'private, max-age=86400',
    },
  });
});
