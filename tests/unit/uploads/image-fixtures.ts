/**
 * Small images built by hand or with sharp for the upload tests. Hand-written encoders are
 * used where sharp cannot produce the variant (16-bit TIFF, BMP) so the decoder under test
 * is never also the writer.
 */
import { crc32, deflateSync } from 'node:zlib';

import sharp, { type Sharp } from 'sharp';

export const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/** An 8-bit RGB test card: red (220, 0, 0) left half, blue (0, 0, 220) right half. */
export function rgbCard(width: number, height: number): Sharp {
  const data = Buffer.alloc(width * height * 3);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 3;
      if (x < width / 2) data[i] = 220;
      else data[i + 2] = 220;
    }
  }
  return sharp(data, { raw: { width, height, channels: 3 } });
}

/** 16-bit sample of a horizontal ramp over the full range: 0 at the left edge, 65535 at the right. */
export function rampSample(x: number, width: number): number {
  return Math.round((x / (width - 1)) * 65535);
}

export function pngChunk(type: string, data: Buffer): Buffer {
  const typeAndData = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(typeAndData));
  return Buffer.concat([length, typeAndData, crc]);
}

function pngIhdr(width: number, height: number, bitDepth: number, colourType: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = bitDepth;
  ihdr[9] = colourType;
  return ihdr;
}

/** A 16-bit greyscale PNG holding the ramp (PNG stores samples big-endian, filter 0 per row). */
export function grey16RampPng(width: number, height: number): Buffer {
  const rowBytes = 1 + width * 2;
  const scanlines = Buffer.alloc(height * rowBytes);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++)
      scanlines.writeUInt16BE(rampSample(x, width), y * rowBytes + 1 + x * 2);
  }
  return Buffer.concat([
    PNG_SIGNATURE,
    pngChunk('IHDR', pngIhdr(width, height, 16, 0)),
    pngChunk('IDAT', deflateSync(scanlines)),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}

/** A baseline little-endian TIFF, 16-bit greyscale, uncompressed, one strip, holding the ramp. */
export function grey16RampTiff(width: number, height: number): Buffer {
  const entries: Array<[tag: number, type: number, value: number]> = [];
  const pixelBytes = width * height * 2;
  const ifdOffset = 8;
  const entryCount = 9;
  const ifdSize = 2 + entryCount * 12 + 4;
  const pixelOffset = ifdOffset + ifdSize;
  const SHORT = 3;
  const LONG = 4;
  entries.push([256, LONG, width]); // ImageWidth
  entries.push([257, LONG, height]); // ImageLength
  entries.push([258, SHORT, 16]); // BitsPerSample
  entries.push([259, SHORT, 1]); // Compression: none
  entries.push([262, SHORT, 1]); // Photometric: BlackIsZero
  entries.push([273, LONG, pixelOffset]); // StripOffsets
  entries.push([277, SHORT, 1]); // SamplesPerPixel
  entries.push([278, LONG, height]); // RowsPerStrip
  entries.push([279, LONG, pixelBytes]); // StripByteCounts
  const file = Buffer.alloc(pixelOffset + pixelBytes);
  file.write('II', 0, 'latin1');
  file.writeUInt16LE(42, 2);
  file.writeUInt32LE(ifdOffset, 4);
  file.writeUInt16LE(entryCount, ifdOffset);
  entries.forEach(([tag, type, value], i) => {
    const at = ifdOffset + 2 + i * 12;
    file.writeUInt16LE(tag, at);
    file.writeUInt16LE(type, at + 2);
    file.writeUInt32LE(1, at + 4);
    if (type === SHORT) file.writeUInt16LE(value, at + 8);
    else file.writeUInt32LE(value, at + 8);
  });
  file.writeUInt32LE(0, ifdOffset + 2 + entryCount * 12); // no next IFD
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++)
      file.writeUInt16LE(rampSample(x, width), pixelOffset + (y * width + x) * 2);
  }
  return file;
}

/** A minimal uncompressed bottom-up 24-bit BMP (BITMAPINFOHEADER). */
export function bmp24(
  width: number,
  height: number,
  pixel: (x: number, y: number) => [r: number, g: number, b: number],
): Buffer {
  const rowBytes = Math.ceil((width * 3) / 4) * 4;
  const pixelOffset = 14 + 40;
  const file = Buffer.alloc(pixelOffset + rowBytes * height);
  file.write('BM', 0, 'latin1');
  file.writeUInt32LE(file.length, 2);
  file.writeUInt32LE(pixelOffset, 10);
  file.writeUInt32LE(40, 14);
  file.writeInt32LE(width, 18);
  file.writeInt32LE(height, 22);
  file.writeUInt16LE(1, 26);
  file.writeUInt16LE(24, 28);
  file.writeUInt32LE(0, 30);
  file.writeUInt32LE(rowBytes * height, 34);
  for (let y = 0; y < height; y++) {
    const row = pixelOffset + (height - 1 - y) * rowBytes;
    for (let x = 0; x < width; x++) {
      const [r, g, b] = pixel(x, y);
      file[row + x * 3] = b;
      file[row + x * 3 + 1] = g;
      file[row + x * 3 + 2] = r;
    }
  }
  return file;
}

/** A syntactically valid PNG whose header claims 100 000 × 100 000 pixels (10 gigapixels). */
export function pngBombHeader(): Buffer {
  return Buffer.concat([
    PNG_SIGNATURE,
    pngChunk('IHDR', pngIhdr(100_000, 100_000, 8, 0)),
    pngChunk('IDAT', deflateSync(Buffer.alloc(16))),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}
