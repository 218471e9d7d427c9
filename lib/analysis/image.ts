import { AnalysisError, type GrayImage, type RegionOfInterest } from './types';

/** Pixels as floats on the 0–255 scale (16-bit sources keep their extra precision). */
export interface FloatImage {
  width: number;
  height: number;
  data: Float32Array;
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
      'bad-input',
      `Image size ${width}×${height} is too small; use at least 320×240 pixels.`,
    );
  }
  if (width * height > MAX_ANALYSIS_PIXELS) {
    throw new AnalysisError('bad-input', tooManyPixelsMessage(width, height));
  }
  if (data.length !== width * height) {
    throw new AnalysisError(
      'bad-input',
      `Pixel buffer holds ${data.length} samples but ${width}×${height} needs ${width * height}; pass one gray sample per pixel.`,
    );
  }
}

/** Crops to the region of interest and converts to floats (0–255). */
export function toFloatImage(
  image: GrayImage,
  roi?: RegionOfInterest,
): { image: FloatImage; offsetX: number; offsetY: number } {
  const x0 = roi ? Math.max(0, Math.floor(roi.x)) : 0;
  const y0 = roi ? Math.max(0, Math.floor(roi.y)) : 0;
  const x1 = roi ? Math.min(image.width, Math.ceil(roi.x + roi.width)) : image.width;
  const y1 = roi ? Math.min(image.height, Math.ceil(roi.y + roi.height)) : image.height;
  const width = x1 - x0;
  const height = y1 - y0;
  if (width < 16 || height < 16)
    throw new AnalysisError(
      'bad-input',
      'The region of interest is too small or outside the image.',
    );
  const scale = image.data instanceof Uint16Array ? 255 / 65535 : 1;
  const out = new Float32Array(width * height);
  for (let y = 0; y < height; y++) {
    const srcRow = (y + y0) * image.width + x0;
    const dstRow = y * width;
    for (let x = 0; x < width; x++) out[dstRow + x] = image.data[srcRow + x] * scale;
  }
  return { image: { width, height, data: out }, offsetX: x0, offsetY: y0 };
}

export function toUint8(image: FloatImage): Uint8Array {
  const out = new Uint8Array(image.data.length);
  for (let i = 0; i < out.length; i++) out[i] = Math.round(image.data[i]);
  return out;
}

/** Bilinear sample with edge clamping. */
export function sampleBilinear(image: FloatImage, x: number, y: number): number {
  const { width, height, data } = image;
  const cx = Math.min(Math.max(x, 0), width - 1.000001);
  const cy = Math.min(Math.max(y, 0), height - 1.000001);
  const ix = Math.floor(cx);
  const iy = Math.floor(cy);
  const fx = cx - ix;
  const fy = cy - iy;
  const i = iy * width + ix;
  const top = data[i] + fx * (data[i + 1] - data[i]);
  const bottom = data[i + width] + fx * (data[i + width + 1] - data[i + width]);
  return top + fy * (bottom - top);
}
