import { createHash } from 'node:crypto';

import sharp from 'sharp';
import { describe, expect, it } from 'vitest';

import {
  ImageRefusedError,
  MAX_IMAGE_PIXELS,
  inspectImage,
  sniffImageFormat,
} from '@/lib/uploads/inspect-image';

import {
  bmp24,
  grey16RampPng,
  grey16RampTiff,
  pngBombHeader,
  rgbCard as card,
} from './image-fixtures';

const WIDTH = 64;
const HEIGHT = 48;
const rampSampleAt = (x: number) => Math.round((x / (WIDTH - 1)) * 65535);
const rgbCard = (width = WIDTH, height = HEIGHT) => card(width, height);

function sha256(bytes: Buffer): string {
  return createHash('sha256').update(bytes).digest('hex');
}

async function refusal(promise: Promise<unknown>): Promise<ImageRefusedError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(ImageRefusedError);
  return error as ImageRefusedError;
}

async function pixelAt(png: Buffer, x: number, y: number): Promise<number[]> {
  const { data, info } = await sharp(png).raw().toBuffer({ resolveWithObject: true });
  const i = (y * info.width + x) * info.channels;
  return Array.from(data.subarray(i, i + info.channels));
}

describe('inspectImage: accepted formats', () => {
  it('accepts an 8-bit PNG with its dimensions and SHA-256, and needs no worker copy', async () => {
    const bytes = await rgbCard().png().toBuffer();
    const result = await inspectImage(bytes);
    expect(result).toMatchObject({
      format: 'png',
      mime: 'image/png',
      width: WIDTH,
      height: HEIGHT,
    });
    expect(result.bitDepth).toBe(8);
    expect(result.sha256).toBe(sha256(bytes));
    expect(result.orientedPng).toBeUndefined();
    const thumb = await sharp(result.thumbnailPng).metadata();
    expect(thumb.format).toBe('png');
    expect(thumb.width).toBe(WIDTH); // never enlarged beyond the original
  });

  it('accepts a JPEG', async () => {
    const bytes = await rgbCard().jpeg({ quality: 90 }).toBuffer();
    const result = await inspectImage(bytes);
    expect(result).toMatchObject({
      format: 'jpeg',
      mime: 'image/jpeg',
      width: WIDTH,
      height: HEIGHT,
    });
    expect(result.sha256).toBe(sha256(bytes));
    expect(result.orientedPng).toBeUndefined();
  });

  it('accepts an 8-bit TIFF and makes a lossless PNG for the worker', async () => {
    const bytes = await rgbCard().tiff().toBuffer();
    const result = await inspectImage(bytes);
    expect(result).toMatchObject({
      format: 'tiff',
      mime: 'image/tiff',
      width: WIDTH,
      height: HEIGHT,
    });
    expect(result.bitDepth).toBe(8);
    expect(result.sha256).toBe(sha256(bytes));
    expect(result.orientedPng).toBeInstanceOf(Buffer);
    expect(await pixelAt(result.orientedPng!, 2, 2)).toEqual([220, 0, 0]);
    expect(await pixelAt(result.orientedPng!, WIDTH - 2, 2)).toEqual([0, 0, 220]);
  });

  it.each([
    ['tiff', grey16RampTiff],
    ['png', grey16RampPng],
  ] as const)('accepts a 16-bit %s and keeps 16 bits in the worker PNG', async (format, make) => {
    const bytes = make(WIDTH, HEIGHT);
    expect((await sharp(bytes).metadata()).depth).toBe('ushort');
    const result = await inspectImage(bytes);
    expect(result).toMatchObject({ format, width: WIDTH, height: HEIGHT, bitDepth: 16 });
    expect(result.sha256).toBe(sha256(bytes));
    const worker = await sharp(result.orientedPng!).metadata();
    expect(worker).toMatchObject({ format: 'png', depth: 'ushort', width: WIDTH, height: HEIGHT });
    const { data, info } = await sharp(result.orientedPng!)
      .toColourspace('grey16')
      .raw({ depth: 'ushort' })
      .toBuffer({ resolveWithObject: true });
    expect(info.channels).toBe(1);
    const samples = new Uint16Array(data.buffer, data.byteOffset, data.length / 2);
    // Full 16-bit range survives (an 8-bit detour would give multiples of 257 only).
    expect(samples[0]).toBe(0);
    expect(samples[WIDTH - 1]).toBe(65535);
    expect(samples[1]).toBe(rampSampleAt(1));
    expect(samples[1] % 257).not.toBe(0);
    const thumb = await sharp(result.thumbnailPng).metadata();
    expect(thumb.depth).toBe('uchar');
  });

  it('accepts an uncompressed 24-bit BMP (decoded without sharp) with correct colours', async () => {
    const bytes = bmp24(WIDTH, HEIGHT, (x, y) =>
      y < 4 ? [0, 200, 0] : x < WIDTH / 2 ? [220, 0, 0] : [0, 0, 220],
    );
    const result = await inspectImage(bytes);
    expect(result).toMatchObject({
      format: 'bmp',
      mime: 'image/bmp',
      width: WIDTH,
      height: HEIGHT,
    });
    expect(result.sha256).toBe(sha256(bytes));
    const worker = result.orientedPng!;
    expect(await pixelAt(worker, 1, 1)).toEqual([0, 200, 0]); // top rows stay on top
    expect(await pixelAt(worker, 1, HEIGHT - 1)).toEqual([220, 0, 0]);
    expect(await pixelAt(worker, WIDTH - 1, HEIGHT - 1)).toEqual([0, 0, 220]);
  });

  it('applies EXIF orientation 6 (rotate 90° clockwise) to dimensions and the worker PNG', async () => {
    // Stored 64 × 48 with red on the left; orientation 6 shows it 48 × 64 with red on top.
    const bytes = await rgbCard().jpeg({ quality: 95 }).withMetadata({ orientation: 6 }).toBuffer();
    expect((await sharp(bytes).metadata()).orientation).toBe(6);
    const result = await inspectImage(bytes);
    expect(result).toMatchObject({ width: HEIGHT, height: WIDTH, exifOrientation: 6 });
    const worker = await sharp(result.orientedPng!).metadata();
    expect([worker.width, worker.height]).toEqual([HEIGHT, WIDTH]);
    const top = await pixelAt(result.orientedPng!, HEIGHT / 2, 2);
    const bottom = await pixelAt(result.orientedPng!, HEIGHT / 2, WIDTH - 3);
    expect(top[0]).toBeGreaterThan(180);
    expect(bottom[2]).toBeGreaterThan(180);
    const thumb = await sharp(result.thumbnailPng).metadata();
    expect([thumb.width, thumb.height]).toEqual([HEIGHT, WIDTH]);
  });

  it('makes a thumbnail 320 px wide for larger photos', async () => {
    const bytes = await rgbCard(1280, 960).png().toBuffer();
    const result = await inspectImage(bytes);
    const thumb = await sharp(result.thumbnailPng).metadata();
    expect([thumb.width, thumb.height]).toEqual([320, 240]);
  });
});

describe('inspectImage: refusals', () => {
  it('refuses a text file named .png as not-an-image (the name is never trusted)', async () => {
    const bytes = Buffer.from('drop_01.png\nthis is a lab note, not a photo\n', 'utf8');
    expect(sniffImageFormat(bytes)).toBeNull();
    const error = await refusal(inspectImage(bytes));
    expect(error.code).toBe('not-an-image');
    expect(error.message).toMatch(/PNG, JPEG, TIFF or BMP/);
  });

  it('refuses a GIF as unsupported-format and names it', async () => {
    const bytes = await rgbCard().gif().toBuffer();
    const error = await refusal(inspectImage(bytes));
    expect(error.code).toBe('unsupported-format');
    expect(error.message).toMatch(/GIF/);
  });

  it('refuses a truncated PNG as corrupt', async () => {
    const bytes = await rgbCard(400, 300).png({ compressionLevel: 0 }).toBuffer();
    const error = await refusal(inspectImage(bytes.subarray(0, Math.floor(bytes.length / 2))));
    expect(error.code).toBe('corrupt');
    expect(error.message).toMatch(/export the photo again/i);
  });

  it('refuses a truncated JPEG as corrupt', async () => {
    const bytes = await rgbCard(400, 300).jpeg().toBuffer();
    const error = await refusal(inspectImage(bytes.subarray(0, Math.floor(bytes.length / 2))));
    expect(error.code).toBe('corrupt');
  });

  it('refuses a BMP whose pixel data is cut short as corrupt', async () => {
    const bytes = bmp24(WIDTH, HEIGHT, () => [10, 20, 30]);
    const error = await refusal(inspectImage(bytes.subarray(0, bytes.length - 500)));
    expect(error.code).toBe('corrupt');
  });

  it('refuses an image over the pixel limit given as a parameter', async () => {
    const bytes = await rgbCard(200, 100).png().toBuffer();
    const error = await refusal(inspectImage(bytes, { maxPixels: 10_000 }));
    expect(error.code).toBe('too-many-pixels');
    expect(error.message).toMatch(/200 × 100/);
  });

  it('refuses a decompression bomb: a tiny PNG whose header claims 10 gigapixels', async () => {
    const bytes = pngBombHeader();
    expect(bytes.length).toBeLessThan(100);
    const error = await refusal(inspectImage(bytes));
    expect(error.code).toBe('too-many-pixels');
  });

  it('refuses a genuine 48-megapixel PNG that compresses to a few hundred kilobytes', async () => {
    const bytes = await sharp({
      create: { width: 8000, height: 6000, channels: 3, background: '#000' },
    })
      .png({ compressionLevel: 9 })
      .toBuffer();
    expect(bytes.length).toBeLessThan(MAX_IMAGE_PIXELS / 100);
    const error = await refusal(inspectImage(bytes));
    expect(error.code).toBe('too-many-pixels');
    expect(error.message).toMatch(/8000 × 6000 pixels \(48\.0 MP\).*up to 40 MP/);
  });

  it('refuses a BMP bomb from its header before decoding it', async () => {
    const bytes = bmp24(4, 4, () => [0, 0, 0]);
    bytes.writeInt32LE(50_000, 18);
    bytes.writeInt32LE(50_000, 22);
    const error = await refusal(inspectImage(bytes));
    expect(error.code).toBe('too-many-pixels');
  });

  it('refuses a file over the byte limit as too-large', async () => {
    const bytes = await rgbCard().png().toBuffer();
    const error = await refusal(inspectImage(bytes, { maxBytes: 100 }));
    expect(error.code).toBe('too-large');
    expect(MAX_IMAGE_PIXELS).toBe(40_000_000);
  });
});
