import { route } from '@/server/http/route';
import { readOpenCvWasm } from '@/server/health/opencv-wasm';

/**
 * The OpenCV WebAssembly binary for the analysis worker, served from the installed package so
 * nothing is fetched from elsewhere and no copy is kept in the repository.
 */
export const GET = route({ access: 'public' }, async () => {
  const bytes = await readOpenCvWasm();
  return new Response(new Uint8Array(bytes), {
    headers: {
      'content-type': 'application/wasm',
      'cache-control': 'public, max-age=604800, immutable',
    },
  });
});
