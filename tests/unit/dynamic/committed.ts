/** The committed series (fixtures/series/<name>/): manifest, frame paths and decoded frames. */
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import type { GrayImage } from '@/lib/analysis';
import { decodeImageFile } from '@/lib/analysis/node/decode';

export const ROOT = path.resolve(__dirname, '../../..');

/** The phases of a drop grown and withdrawn through the needle left in it, in order. */
export const NEEDLE_IN_PHASES = ['pinned', 'advancing', 'pinned', 'receding'];

export interface CommittedManifest {
  fps: number;
  frameCount: number;
  expected: Record<string, number>;
  frames: ({ file: string } & Record<string, unknown>)[];
}

export function committedSeries(name: string) {
  const relativeDir = `fixtures/series/${name}`;
  const dir = path.join(ROOT, relativeDir);
  const manifest = JSON.parse(
    readFileSync(path.join(dir, 'manifest.json'), 'utf8'),
  ) as CommittedManifest;
  const files = readdirSync(dir)
    .filter((f) => f.endsWith('.png'))
    .sort();
  return {
    dir,
    manifest,
    /** Frame paths relative to the repository root, in order. */
    frameFiles: files.map((f) => `${relativeDir}/${f}`),
    decodeFrames: (): Promise<GrayImage[]> =>
      Promise.all(files.map((f) => decodeImageFile(path.join(dir, f)))),
  };
}
