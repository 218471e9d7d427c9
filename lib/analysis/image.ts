import { AnalysisError, type GrayImage, type RegionOfInterest } from './types';

/**
 * The analysed pixels: gray samples read on the 0–255 scale (`data[i] · scale`), so 16-bit sources
 * keep their extra precision without a converted copy. 8-bit sources are used in place.
 */
export interface PixelImage {
  width: number;
  height: number;
  data: Uint8Array | Uint16Array;
  /** Factor to the 0–255 scale: 1 for 8-bit, 255 / 65535 for 16-bit samples. */
  scale: number;
}

/**
 * Most pixels one analysis takes: 40 MP, the upload limit (lib/uploads/inspect-image.ts), well
 * above any goniometer camera, and low enough that one analysis cannot hold the server for long.
 */
export const MAX_ANALYSIS_PIXELS = 40_000_000;

export function tooManyPixelsMessage(width: number, height: number): string {
  return (
    `The image has ${width} × ${height} pixels (${((width * height) / 1e6).toFixed(1)} MP); ` +
    `the analysis takes at most ${MAX_ANALYSIS_PIXELS / 1e6} MP. Crop the photo to the drop and try again.`
  );
}

export function validateImage(image: GrayImage): void {
  const { width, height, data } = image;
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 16 || height < 16) {
    throw new AnalysisError(
      'bad_input',
      `Image size ${width}×${height} is too small; use at least 320×240 pixels.`,
    );
  }
  if (width * height > MAX_ANALYSIS_PIXELS) {
    throw new AnalysisError('bad_input', tooManyPixelsMessage(width, height));
  }
  if (data.length !== width * height) {
    throw new AnalysisError(
      'bad_input',
      `Pixel buffer holds ${data.length} samples but ${width}×${height} needs ${width * height}; pass one gray sample per pixel.`,
    );
  }
}

/** The region of interest as a PixelImage (no copy without a region), and its offset. */
export function pixelImage(
  image: GrayImage,
  roi?: RegionOfInterest,
): { image: PixelImage; offsetX: number; offsetY: number } {
  const source =
    image.data instanceof Uint16Array
      ? image.data
      : new Uint8Array(image.data.buffer, image.data.byteOffset, image.data.length);
  const scale = source instanceof Uint16Array ? 255 / 65535 : 1;
  if (!roi) {
    return {
      image: { width: image.width, height: image.height, data: source, scale },
      offsetX: 0,
      offsetY: 0,
    };
  }
  const x0 = Math.max(0, Math.floor(roi.x));
  const y0 = Math.max(0, Math.floor(roi.y));
  const x1 = Math.min(image.width, Math.ceil(roi.x + roi.width));
  const y1 = Math.min(image.height, Math.ceil(roi.y + roi.height));
  const width = x1 - x0;
  const height = y1 - y0;
  if (width < 16 || height < 16)
    throw new AnalysisError(
      'bad_input',
      'The region of interest is too small or outside the image.',
    );
  const out =
    source instanceof Uint16Array
      ? new Uint16Array(width * height)
      : new Uint8Array(width * height);
  for (let y = 0; y < height; y++) {
    const from = (y + y0) * image.width + x0;
    out.set(source.subarray(from, from + width), y * width);
  }
  return { image: { width, height, data: out, scale }, offsetX: x0, offsetY: y0 };
}

/** 8-bit samples for OpenCV: the pixels themselves when they are 8-bit, else rounded. */
export function toUint8(image: PixelImage): Uint8Array {
  if (image.data instanceof Uint8Array) return image.data;
  const out = new Uint8Array(image.data.length);
  const { data, scale } = image;
  for (let i = 0; i < out.length; i++) out[i] = Math.round(data[i] * scale);
  return out;
}

/** Bilinear sample (0–255 scale) with edge clamping. */
export function sampleBilinear(image: PixelImage, x: number, y: number): number {
  const { width, height, data } = image;
  const cx = x < 0 ? 0 : x > width - 1.000001 ? width - 1.000001 : x;
  const cy = y < 0 ? 0 : y > height - 1.000001 ? height - 1.000001 : y;
  const ix = cx | 0;
  const iy = cy | 0;
  const fx = cx - ix;
  const fy = cy - iy;
  const i = iy * width + ix;
  const a = data[i];
  const b = data[i + 1];
  const c = data[i + width];
  const d = data[i + width + 1];
  const top = a + fx * (b - a);
  const bottom = c + fx * (d - c);
  return (top + fy * (bottom - top)) * image.scale;
}
