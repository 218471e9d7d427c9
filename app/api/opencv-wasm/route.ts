import { readFile } from 'node:fs/promises';
import path from 'node:path';

// The OpenCV WebAssembly binary for the analysis worker, served from the installed package so
// nothing is fetched from elsewhere and no copy is kept in the repository.
let cached: Promise<Buffer> | null = null;

export async function GET() {
  cached ??= readFile(path.join(process.cwd(), 'node_modules', 'opencv-wasm', 'opencv.wasm'));
  const bytes = await cached;
  return new Response(new Uint8Array(bytes), {
    headers: { 'content-type': 'application/wasm', 'cache-control': 'public, max-age=604800, immutable' },
  });
}
