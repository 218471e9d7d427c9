/**
 * Node-only image decoding for the CLI and server-side re-analysis (never imported by the worker).
 * PNG, JPEG, TIFF (and anything else sharp reads) go through sharp; BMP, which sharp cannot read,
 * goes through the small reader below. Colour is converted to gray here, so lib/analysis only sees
 * gray pixels. 16-bit sources stay 16-bit.
 */
import { readFile } from 'node:fs/promises';
import sharp, { type Metadata } from 'sharp';
import { MAX_ANALYSIS_PIXELS, tooManyPixelsMessage } from '../image';
import type { GrayImage } from '../types';

export class DecodeError extends Error {
  readonly code = 'unreadable_image' as const;
}

export async function decodeImageFile(path: string): Promise<GrayImage> {
  let bytes: Buffer;
  try {
    bytes = await readFile(path);
  } catch (error) {
    throw new DecodeError(`Cannot read ${path}: ${(error as Error).message}`);
  }
  return decodeImageBytes(bytes);
}

export async function decodeImageBytes(bytes: Uint8Array): Promise<GrayImage> {
  if (bytes.length > 2 && bytes[0] === 0x42 && bytes[1] === 0x4d) return decodeBmp(bytes);
  let meta: Metadata;
  try {
    meta = await sharp(bytes).metadata();
  } catch (error) {
    throw unreadable(error);
  }
  // Refused before decoding: the pixels of a larger image would take hundreds of MB.
  const { width = 0, height = 0 } = meta;
  if (width * height > MAX_ANALYSIS_PIXELS) {
    throw new DecodeError(tooManyPixelsMessage(width, height));
  }
  try {
    const sixteen = meta.depth === 'ushort';
    const pipeline = sharp(bytes).flatten({ background: '#ffffff' });
    if (sixteen) {
      const { data, info } = await pipeline
        .toColourspace('grey16')
        .raw({ depth: 'ushort' })
        .toBuffer({ resolveWithObject: true });
      const samples = new Uint16Array(data.buffer, data.byteOffset, data.byteLength / 2);
      return {
        width: info.width,
        height: info.height,
        data: firstChannel16(samples, info.channels, info.width * info.height),
      };
    }
    const { data, info } = await pipeline.greyscale().raw().toBuffer({ resolveWithObject: true });
    return {
      width: info.width,
      height: info.height,
      data: firstChannel8(
        new Uint8Array(data.buffer, data.byteOffset, data.byteLength),
        info.channels,
        info.width * info.height,
      ),
    };
  } catch (error) {
    throw unreadable(error);
  }
}

const unreadable = (error: unknown) =>
  new DecodeError(`Not a readable image (PNG, JPEG, TIFF or BMP): ${(error as Error).message}`);

function firstChannel8(data: Uint8Array, channels: number, count: number): Uint8Array {
  if (channels === 1) return data.slice(0, count);
  const out = new Uint8Array(count);
  for (let i = 0; i < count; i++) out[i] = data[i * channels];
  return out;
}

function firstChannel16(data: Uint16Array, channels: number, count: number): Uint16Array {
  if (channels === 1) return data.slice(0, count);
  const out = new Uint16Array(count);
  for (let i = 0; i < count; i++) out[i] = data[i * channels];
  return out;
}

/**
 * Uncompressed Windows bitmap (BITMAPINFOHEADER or later; 8-bit palette, 24-bit or 32-bit BI_RGB /
 * BI_BITFIELDS with the usual masks), converted to gray with Rec. 601 luma weights.
 */
export function decodeBmp(bytes: Uint8Array): GrayImage {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const fail = (why: string): never => {
    throw new DecodeError(`Unsupported BMP: ${why}`);
  };
  if (bytes.length < 54) fail('file too short');
  const dataOffset = view.getUint32(10, true);
  const headerSize = view.getUint32(14, true);
  if (headerSize < 40) fail('old OS/2 header');
  const width = view.getInt32(18, true);
  const rawHeight = view.getInt32(22, true);
  const bitCount = view.getUint16(28, true);
  const compression = view.getUint32(30, true);
  if (width <= 0 || rawHeight === 0) fail('bad dimensions');
  if (compression !== 0 && compression !== 3) fail('compressed (RLE) bitmaps are not supported');
  if (![8, 24, 32].includes(bitCount)) fail(`${bitCount}-bit pixels are not supported`);
  const height = Math.abs(rawHeight);
  const bottomUp = rawHeight > 0;
  const rowBytes = Math.ceil((width * bitCount) / 32) * 4;
  if (dataOffset + rowBytes * height > bytes.length) fail('pixel data truncated');
  const luma = (r: number, g: number, b: number) => Math.round(0.299 * r + 0.587 * g + 0.114 * b);
  let palette: Uint8Array | null = null;
  if (bitCount === 8) {
    const colours = view.getUint32(46, true) || 256;
    palette = new Uint8Array(256);
    const base = 14 + headerSize;
    for (let c = 0; c < colours && base + 4 * c + 2 < bytes.length; c++) {
      palette[c] = luma(bytes[base + 4 * c + 2], bytes[base + 4 * c + 1], bytes[base + 4 * c]);
    }
  }
  const out = new Uint8Array(width * height);
  for (let row = 0; row < height; row++) {
    const src = dataOffset + (bottomUp ? height - 1 - row : row) * rowBytes;
    for (let x = 0; x < width; x++) {
      let value: number;
      if (palette) value = palette[bytes[src + x]];
      else {
        const p = src + x * (bitCount / 8);
        value = luma(bytes[p + 2], bytes[p + 1], bytes[p]);
      }
      out[row * width + x] = value;
    }
  }
  return { width, height, data: out };
}
