/**
 * Writes the committed synthetic drop photos (fixtures/drops/*.png|bmp) and their manifest with
 * the true parameters. Deterministic: the same seeds give the same files.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { FIXTURES } from '../fixtures/generator/catalog';
import { renderDrop } from '../fixtures/generator/render';
import { encodeGrayBmp } from '../fixtures/generator/bmp';

const round = (v: number) => Number(v.toFixed(4));

async function main() {
  const dir = path.join(process.cwd(), 'fixtures', 'drops');
  await mkdir(dir, { recursive: true });
  const manifest = [];
  for (const spec of FIXTURES) {
    const { image, truth, scene } = renderDrop(spec.scene);
    const file = `${spec.name}.${spec.format === 'jpeg' ? 'jpg' : spec.format}`;
    let bytes: Uint8Array;
    if (spec.format === 'bmp') bytes = encodeGrayBmp(image);
    else if (spec.format === 'jpeg') {
      // A colour camera's photo: the gray render tinted per channel, JPEG quality 90.
      const [r, g, b] = spec.tint ?? [1, 1, 1];
      const rgb = Buffer.alloc(image.width * image.height * 3);
      for (let i = 0; i < image.width * image.height; i++) {
        const value = image.data[i];
        rgb[3 * i] = Math.round(value * r);
        rgb[3 * i + 1] = Math.round(value * g);
        rgb[3 * i + 2] = Math.round(value * b);
      }
      bytes = await sharp(rgb, { raw: { width: image.width, height: image.height, channels: 3 } })
        .jpeg({ quality: 90 })
        .toBuffer();
    }
    else if (image.data instanceof Uint16Array) {
      bytes = await sharp(image.data, {
        raw: { width: image.width, height: image.height, channels: 1 },
      })
        .toColourspace('grey16')
        .png({ compressionLevel: 9 })
        .toBuffer();
    } else {
      bytes = await sharp(Buffer.from(image.data), {
        raw: { width: image.width, height: image.height, channels: 1 },
      })
        .png({ compressionLevel: 9 })
        .toBuffer();
    }
    await writeFile(path.join(dir, file), bytes);
    manifest.push({
      file,
      description: spec.description,
      width: image.width,
      height: image.height,
      bitDepth: scene.bitDepth,
      truth: {
        contactAngleDeg: truth.contactAngleDeg,
        leftAngleDeg: round(truth.leftAngleDeg),
        rightAngleDeg: round(truth.rightAngleDeg),
        bond: truth.bond,
        apexRadiusPx: round(truth.apexRadiusPx),
        baseline: {
          x1: round(truth.baseline.x1),
          y1: round(truth.baseline.y1),
          x2: round(truth.baseline.x2),
          y2: round(truth.baseline.y2),
        },
        contactLeft: truth.contactLeft.map(round),
        contactRight: truth.contactRight.map(round),
        baseDiameterPx: round(truth.baseDiameterPx),
        heightPx: round(truth.heightPx),
        volumePx3: Math.round(truth.volumePx3),
        surfaceAreaPx2: Math.round(truth.surfaceAreaPx2),
      },
      scene: {
        tiltDeg: scene.tiltDeg,
        plateTiltDeg: scene.plateTiltDeg,
        colour: spec.tint ?? null,
        blurPx: scene.blurPx,
        noise: scene.noise,
        reflection: scene.reflection,
        needle: scene.needle,
        lensSpot: scene.lensSpot,
        seed: scene.seed,
      },
    });
    process.stdout.write(`${file}  ${(bytes.length / 1024).toFixed(0)} kB\n`);
  }
  await writeFile(
    path.join(dir, 'manifest.json'),
    `${JSON.stringify({ generator: 'fixtures/generator/render.ts', coordinates: 'image pixels, origin at the top-left pixel centre, y down', drops: manifest }, null, 2)}\n`,
  );
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exitCode = 1;
});
