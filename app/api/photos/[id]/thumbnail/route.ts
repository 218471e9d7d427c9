import { idParamsSchema } from '@/lib/contracts/common';
import { route } from '@/server/http/route';
import { loadPhotoThumbnail } from '@/server/photos/pixels';

/** The photo's thumbnail (PNG). */
export const GET = route(
  { access: 'results:read-all', params: idParamsSchema },
  async ({ ctx, params }) =>
    new Response(new Uint8Array(await loadPhotoThumbnail(ctx.organization.id, params.id)), {
      headers: {
        'content-type': 'image/png',
        'cache-control': 'private, max-age=86400, immutable',
      },
    }),
);
