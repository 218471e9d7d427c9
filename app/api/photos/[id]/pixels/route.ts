import { idParamsSchema } from '@/lib/contracts/common';
import { route } from '@/server/http/route';
import { loadPhotoGrayPixels } from '@/server/photos/pixels';

/**
 * The photo's canonical gray pixels for the analysis worker: decoded on the server exactly as the
 * server decodes them to save an analysis, so the browser and the server analyse the same samples
 * (lib/analysis/gray-pixels.ts), gzip-compressed (the worker inflates them; a Content-Encoding
 * header would be dropped on the way by the server's own compression layer).
 */
export const GET = route(
  { access: 'results:read-all', params: idParamsSchema },
  async ({ ctx, params }) =>
    new Response(new Uint8Array(await loadPhotoGrayPixels(ctx.organization.id, params.id)), {
      headers: {
        'content-type': 'application/gzip',
        'cache-control': 'private, max-age=86400',
      },
    }),
);
