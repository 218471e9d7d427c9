import { idParamsSchema } from '@/lib/contracts/common';
import { route } from '@/server/http/route';
import { loadPhotoBytes } from '@/server/photos/pixels';

/** The photo for the workspace canvas and worker, same-origin so canvases stay readable. */
export const GET = route(
  { access: 'results:read-all', params: idParamsSchema },
  async ({ ctx, params }) => {
    const { bytes, contentType } = await loadPhotoBytes(ctx.organization.id, params.id);
    return new Response(new Uint8Array(bytes), {
      headers: {
        'content-type': contentType,
        'cache-control': 'private, max-age=86400, immutable',
      },
    });
  },
);
