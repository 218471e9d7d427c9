import 'server-only';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';

/** Writes `bytes` to a private temporary file for ffmpeg, runs `work` on it, then removes it. */
export async function withTempFile<T>(
  bytes: Uint8Array,
  work: (file: string) => Promise<T>,
): Promise<T> {
  const dir = await mkdtemp(path.join(tmpdir(), 'beadline-video-'));
  try {
    const file = path.join(dir, 'source');
    await writeFile(file, bytes);
    return await work(file);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}
