/**
 * Writes the committed series (fixtures/series/<name>/frame-NNN.png, manifest.json with the truth
 * of every frame, and extra files such as the tilt log). Deterministic: the same seeds give the
 * same files.
 *
 *   npm run fixtures:series
 */
import { mkdir, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { COMMITTED_SERIES } from '../fixtures/generator/series-catalog';

/** Rounds every number in a truth record so the manifest stays readable. */
function rounded(value: unknown): unknown {
  if (typeof value === 'number') return Number(value.toPrecision(10));
  if (Array.isArray(value)) return value.map(rounded);
  if (value && typeof value === 'object')
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, rounded(v)]));
  return value;
}

export const frameFile = (index: number) => `frame-${String(index).padStart(3, '0')}.png`;

async function main() {
  const root = path.join(process.cwd(), 'fixtures', 'series');
  for (const series of COMMITTED_SERIES) {
    const dir = path.join(root, series.name);
    await rm(dir, { recursive: true, force: true });
    await mkdir(dir, { recursive: true });
    let bytes = 0;
    const frames = [];
    for (let i = 0; i < series.frameCount; i++) {
      const image = series.render(i);
      const png = await sharp(Buffer.from(image.data as Uint8Array), {
        raw: { width: image.width, height: image.height, channels: 1 },
      })
        .png({ compressionLevel: 9 })
        .toBuffer();
      await writeFile(path.join(dir, frameFile(i)), png);
      bytes += png.length;
      frames.push({ file: frameFile(i), ...(rounded(series.truth(i)) as object) });
    }
    for (const [name, text] of Object.entries(series.extras))
      await writeFile(path.join(dir, name), text);
    await writeFile(
      path.join(dir, 'manifest.json'),
      `${JSON.stringify(
        {
          generator: 'fixtures/generator/series-catalog.ts',
          description: series.description,
          coordinates: 'image pixels, origin at the top-left pixel centre, y down',
          fps: series.fps,
          frameCount: series.frameCount,
          expected: series.expected,
          frames,
        },
        null,
        2,
      )}\n`,
    );
    process.stdout.write(
      `${series.name}: ${series.frameCount} frames, ${(bytes / 1024).toFixed(0)} kB\n`,
    );
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exitCode = 1;
});
