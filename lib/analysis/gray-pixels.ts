/**
 * One set of pixels: the canonical gray image of a photo travels from the server (which decodes
 * the stored photo once, with sharp, exactly as it does for its own analysis) to the browser's
 * analysis worker as these bytes, so both analyse the same samples at the same bit depth.
 *
 * Layout (little-endian): the 8 ASCII bytes "BLGRAY1\0", width (uint32), height (uint32), bit
 * depth (uint8, 8 or 16), 3 zero bytes, then width × height samples, row-major (uint8 or uint16).
 * On the wire the whole is gzip-compressed (`readGzipGrayPixels`).
 */
import { AnalysisError, type GrayImage } from './types';

const MAGIC = 'BLGRAY1\0';
const HEADER = 20;

export function encodeGrayPixels(image: GrayImage): Uint8Array {
  const sixteen = image.data instanceof Uint16Array;
  const sampleBytes = sixteen ? 2 : 1;
  const out = new Uint8Array(HEADER + image.width * image.height * sampleBytes);
  for (let i = 0; i < MAGIC.length; i++) out[i] = MAGIC.charCodeAt(i);
  const view = new DataView(out.buffer);
  view.setUint32(8, image.width, true);
  view.setUint32(12, image.height, true);
  view.setUint8(16, sixteen ? 16 : 8);
  if (sixteen) {
    const data = image.data as Uint16Array;
    for (let i = 0; i < data.length; i++) view.setUint16(HEADER + 2 * i, data[i], true);
  } else {
    out.set(image.data as Uint8Array, HEADER);
  }
  return out;
}

export function decodeGrayPixels(bytes: ArrayBuffer | Uint8Array): GrayImage {
  const u8 = bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes);
  const fail = (): never => {
    throw new AnalysisError(
      'bad_input',
      'The photo’s pixels arrived incomplete or in an unknown form; reload the page.',
    );
  };
  if (u8.length < HEADER) fail();
  for (let i = 0; i < MAGIC.length; i++) if (u8[i] !== MAGIC.charCodeAt(i)) fail();
  const view = new DataView(u8.buffer, u8.byteOffset, u8.byteLength);
  const width = view.getUint32(8, true);
  const height = view.getUint32(12, true);
  const depth = view.getUint8(16);
  if (depth !== 8 && depth !== 16) fail();
  const count = width * height;
  if (u8.length !== HEADER + count * (depth / 8)) fail();
  if (depth === 8) return { width, height, data: u8.slice(HEADER) };
  const data = new Uint16Array(count);
  for (let i = 0; i < count; i++) data[i] = view.getUint16(HEADER + 2 * i, true);
  return { width, height, data };
}

/** Inflates gzip-compressed gray pixels (a fetch body) and decodes them. */
export async function readGzipGrayPixels(body: ReadableStream<BufferSource>): Promise<GrayImage> {
  const inflated = body.pipeThrough(new DecompressionStream('gzip'));
  return decodeGrayPixels(await new Response(inflated).arrayBuffer());
}
