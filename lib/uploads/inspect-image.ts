import 'server-only';

import { createHash } from 'node:crypto';

import { decode as decodeBmp } from 'bmp-ts';
import sharp, { type Metadata, type Sharp } from 'sharp';

/**
 * Checks an uploaded drop photo from its bytes and prepares what the rest of the product needs:
 * dimensions (after EXIF orientation), SHA-256 of the original, a thumbnail, and — where a
 * browser cannot decode the original the same way everywhere (TIFF, 16-bit, BMP, EXIF-rotated)
 * — a lossless, upright PNG for the analysis worker.
 */

export const ACCEPTED_IMAGE_FORMATS = ['png', 'jpeg', 'tiff', 'bmp'] as const;
export type AcceptedImageFormat = (typeof ACCEPTED_IMAGE_FORMATS)[number];

/** 25 MB, the same figure (in 1024-based units) the upload route enforces before upload. */
export const MAX_IMAGE_BYTES = 25 * 1024 * 1024;

/**
 * 40 megapixels: comfortably above any goniometer or machine-vision camera (typically 1–20 MP),
 * and low enough that decoding one photo (up to ~320 MB of 16-bit RGBA) cannot exhaust the server.
 */
export const MAX_IMAGE_PIXELS = 40_000_000;

export const THUMBNAIL_WIDTH = 320;

export type ImageRefusalCode =
  'not-an-image' | 'unsupported-format' | 'too-large' | 'too-many-pixels' | 'corrupt';

export class ImageRefusedError extends Error {
  readonly code: ImageRefusalCode;

  constructor(code: ImageRefusalCode, message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'ImageRefusedError';
    this.code = code;
  }
}

export interface InspectedImage {
  format: AcceptedImageFormat;
  mime: string;
  /** Upright dimensions, i.e. after EXIF orientation is applied. */
  width: number;
  height: number;
  /** Bits per channel of the decoded original (8 or 16). */
  bitDepth: 8 | 16;
  /** Hex SHA-256 of the uploaded bytes, exactly as received. */
  sha256: string;
  /** EXIF orientation tag of the original (1 when absent). */
  exifOrientation: number;
  /** Upright lossless PNG (16-bit kept) for the worker, when the original is not browser-safe. */
  orientedPng?: Buffer;
  /** Upright 8-bit sRGB PNG, THUMBNAIL_WIDTH wide (never enlarged). */
  thumbnailPng: Buffer;
}

export interface InspectImageOptions {
  maxBytes?: number;
  maxPixels?: number;
  thumbnailWidth?: number;
}

const MIME_BY_FORMAT: Record<AcceptedImageFormat, string> = {
  png: 'image/png',
  jpeg: 'image/jpeg',
  tiff: 'image/tiff',
  bmp: 'image/bmp',
};

const ACCEPTED_LIST = 'PNG, JPEG, TIFF or BMP';

function startsWith(bytes: Buffer, signature: readonly number[], offset = 0): boolean {
  if (bytes.length < offset + signature.length) return false;
  return signature.every((value, i) => bytes[offset + i] === value);
}

/** Formats we recognise but do not accept, so the message can name them. */
function recogniseOtherImage(bytes: Buffer): string | null {
  const ascii = (start: number, end: number) => bytes.subarray(start, end).toString('latin1');
  if (ascii(0, 4) === 'GIF8') return 'GIF';
  if (ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'WebP';
  if (ascii(4, 8) === 'ftyp') {
    const brand = ascii(8, 12);
    if (brand.startsWith('avi')) return 'AVIF';
    if (brand.startsWith('hei') || brand.startsWith('mif') || brand.startsWith('hev'))
      return 'HEIC';
  }
  if (startsWith(bytes, [0x00, 0x00, 0x00, 0x0c, 0x6a, 0x50, 0x20, 0x20])) return 'JPEG 2000';
  if (startsWith(bytes, [0xff, 0x0a])) return 'JPEG XL';
  if (ascii(0, 5) === '<?xml' || ascii(0, 4) === '<svg') return 'SVG';
  if (ascii(0, 4) === '%PDF') return 'PDF';
  return null;
}

/** Identifies the format from the file's signature (magic bytes); the name is never trusted. */
export function sniffImageFormat(bytes: Buffer): AcceptedImageFormat | null {
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'png';
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'jpeg';
  // Classic TIFF (42) and BigTIFF (43), little- and big-endian.
  if (startsWith(bytes, [0x49, 0x49, 0x2a, 0x00]) || startsWith(bytes, [0x4d, 0x4d, 0x00, 0x2a])) {
    return 'tiff';
  }
  if (startsWith(bytes, [0x49, 0x49, 0x2b, 0x00]) || startsWith(bytes, [0x4d, 0x4d, 0x00, 0x2b])) {
    return 'tiff';
  }
  if (startsWith(bytes, [0x42, 0x4d]) && bytes.length >= 30) return 'bmp';
  return null;
}

function refuseTooManyPixels(width: number, height: number, maxPixels: number): never {
  const megapixels = ((width * height) / 1e6).toFixed(1);
  throw new ImageRefusedError(
    'too-many-pixels',
    `The image claims ${width} × ${height} pixels (${megapixels} MP); Beadline accepts up to ` +
      `${(maxPixels / 1e6).toFixed(0)} MP. Crop or downscale the photo to the drop and upload it again.`,
  );
}

function corrupt(format: string, cause: unknown): ImageRefusedError {
  return new ImageRefusedError(
    'corrupt',
    `The file looks like a ${format.toUpperCase()} image but cannot be decoded (it may be ` +
      `truncated or damaged). Export the photo again from the camera software and re-upload it.`,
    { cause },
  );
}

/** BITMAPINFOHEADER and its V2–V5 extensions; the old OS/2 headers (12, 64 bytes) are not read. */
const BMP_INFO_HEADER_SIZES = new Set([40, 52, 56, 108, 124]);

/**
 * BMP is not decoded by sharp; bmp-ts decodes it to RGBA, which sharp then takes as raw pixels.
 * The header is checked first so a bomb-sized BMP is refused before any buffer is allocated.
 */
function bmpToSharp(bytes: Buffer, maxPixels: number): Sharp {
  const headerSize = bytes.readUInt32LE(14);
  if (!BMP_INFO_HEADER_SIZES.has(headerSize)) {
    throw new ImageRefusedError(
      'unsupported-format',
      `This BMP variant (header of ${headerSize} bytes) is not supported. Save the photo as PNG or ` +
        `TIFF and upload it again.`,
    );
  }
  const width = bytes.readInt32LE(18);
  const height = Math.abs(bytes.readInt32LE(22));
  if (width <= 0 || height <= 0) throw corrupt('bmp', new Error('non-positive BMP dimensions'));
  if (width * height > maxPixels) refuseTooManyPixels(width, height, maxPixels);
  const compression = bytes.readUInt32LE(30);
  if (compression !== 0 && compression !== 3 && compression !== 6) {
    throw new ImageRefusedError(
      'unsupported-format',
      'Compressed (RLE) BMP files are not supported. Save the photo as PNG or TIFF and upload it again.',
    );
  }
  const bitsPerPixel = bytes.readUInt16LE(28);
  const pixelOffset = bytes.readUInt32LE(10);
  const rowBytes = Math.ceil((width * bitsPerPixel) / 32) * 4;
  if (pixelOffset + rowBytes * height > bytes.length) {
    throw corrupt('bmp', new Error('BMP pixel data is shorter than its header says'));
  }
  let decoded: { width: number; height: number; data: Buffer };
  try {
    decoded = decodeBmp(bytes, { toRGBA: true });
  } catch (error) {
    throw corrupt('bmp', error);
  }
  // BMP alpha is almost always unused padding (the decoder leaves it 0), so it is dropped.
  return sharp(decoded.data, {
    raw: { width: decoded.width, height: decoded.height, channels: 4 },
  }).removeAlpha();
}

function bitDepthOf(depth: string): 8 | 16 | null {
  if (depth === 'uchar' || depth === 'char') return 8;
  if (depth === 'ushort' || depth === 'short') return 16;
  return null;
}

/**
 * Inspects an uploaded image. Throws ImageRefusedError (with a message that says what to do)
 * when the bytes are not an accepted image, are too large, claim too many pixels, or are corrupt.
 */
export async function inspectImage(
  bytes: Buffer,
  options: InspectImageOptions = {},
): Promise<InspectedImage> {
  const maxBytes = options.maxBytes ?? MAX_IMAGE_BYTES;
  const maxPixels = options.maxPixels ?? MAX_IMAGE_PIXELS;
  const thumbnailWidth = options.thumbnailWidth ?? THUMBNAIL_WIDTH;

  if (bytes.length > maxBytes) {
    throw new ImageRefusedError(
      'too-large',
      `The file is ${(bytes.length / 1024 / 1024).toFixed(1)} MB; the limit is ` +
        `${(maxBytes / 1024 / 1024).toFixed(0)} MB. Crop the photo to the drop or save it as ` +
        `PNG or JPEG and upload it again.`,
    );
  }

  const format = sniffImageFormat(bytes);
  if (!format) {
    const other = recogniseOtherImage(bytes);
    if (other) {
      throw new ImageRefusedError(
        'unsupported-format',
        `${other} files are not accepted. Save the photo as ${ACCEPTED_LIST} and upload it again.`,
      );
    }
    throw new ImageRefusedError(
      'not-an-image',
      `The file is not an image (whatever its name says). Upload a ${ACCEPTED_LIST} photo of the drop.`,
    );
  }

  const sha256 = createHash('sha256').update(bytes).digest('hex');

  let source: Sharp;
  let rawWidth: number;
  let rawHeight: number;
  let exifOrientation = 1;
  let bitDepth: 8 | 16 = 8;
  let channels = 3;

  if (format === 'bmp') {
    source = bmpToSharp(bytes, maxPixels);
    const meta = await source.metadata();
    rawWidth = meta.width;
    rawHeight = meta.height;
  } else {
    // Header only: dimensions are read without decoding, so bombs stop here.
    let meta: Metadata;
    try {
      meta = await sharp(bytes, { limitInputPixels: false }).metadata();
    } catch (error) {
      throw corrupt(format, error);
    }
    if (meta.format !== format) {
      throw corrupt(format, new Error(`decoder reports ${meta.format}`));
    }
    rawWidth = meta.width;
    rawHeight = meta.height;
    if (!rawWidth || !rawHeight) throw corrupt(format, new Error('missing dimensions'));
    if (rawWidth * rawHeight > maxPixels) refuseTooManyPixels(rawWidth, rawHeight, maxPixels);
    const depth = bitDepthOf(meta.depth);
    if (depth === null) {
      throw new ImageRefusedError(
        'unsupported-format',
        `Images with ${meta.depth} samples are not accepted. Save the photo with 8- or 16-bit ` +
          `channels (${ACCEPTED_LIST}) and upload it again.`,
      );
    }
    bitDepth = depth;
    channels = meta.channels;
    exifOrientation = meta.orientation ?? 1;
    // failOn 'error' refuses truncated and damaged data but tolerates harmless warnings that
    // some camera software's JPEGs trigger.
    source = sharp(bytes, { limitInputPixels: maxPixels, failOn: 'error' });
  }

  const rotated = exifOrientation >= 5 && exifOrientation <= 8;
  const width = rotated ? rawHeight : rawWidth;
  const height = rotated ? rawWidth : rawHeight;

  const needsWorkerPng =
    format === 'tiff' || format === 'bmp' || bitDepth === 16 || exifOrientation !== 1;

  let orientedPng: Buffer | undefined;
  let thumbnailPng: Buffer;
  try {
    if (needsWorkerPng) {
      // Full decode; 16-bit samples are kept so the worker sees the camera's full range.
      const upright = source.clone().autoOrient();
      if (bitDepth === 16) upright.toColourspace(channels <= 2 ? 'grey16' : 'rgb16');
      orientedPng = await upright.png({ compressionLevel: 6 }).toBuffer();
    } else {
      // Full decode without keeping the pixels: corrupt or truncated data fails here.
      await source.clone().stats();
    }
    thumbnailPng = await source
      .clone()
      .autoOrient()
      .resize({ width: thumbnailWidth, withoutEnlargement: true })
      .toColourspace('srgb')
      .png()
      .toBuffer();
  } catch (error) {
    if (error instanceof ImageRefusedError) throw error;
    if (error instanceof Error && /pixel limit/i.test(error.message)) {
      refuseTooManyPixels(rawWidth, rawHeight, maxPixels);
    }
    throw corrupt(format, error);
  }

  return {
    format,
    mime: MIME_BY_FORMAT[format],
    width,
    height,
    bitDepth,
    sha256,
    exifOrientation,
    ...(orientedPng ? { orientedPng } : {}),
    thumbnailPng,
  };
}
