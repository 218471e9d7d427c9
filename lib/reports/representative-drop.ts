import 'server-only';
import sharp from 'sharp';
import { analyseDrop } from '@/lib/analysis';
import type { AnalysisResult, Baseline, FitMethod } from '@/lib/analysis/types';
import { decodeImageBytes } from '@/lib/analysis/node/decode';
import { baselineAcross, tangentEnd } from '@/lib/measure/overlay-geometry';

/**
 * The photo of a drop with its analysis drawn in (edge points, baseline, tangents and angles),
 * re-computed by lib/analysis from the stored photo's bytes with the saved method and baseline.
 */
export async function drawAnalysedDrop(input: {
  /** The stored photo's bytes (PNG, JPEG, TIFF or BMP). */
  bytes: Buffer;
  method: FitMethod;
  baseline: Baseline | null;
}): Promise<{ png: Buffer; result: AnalysisResult }> {
  const { bytes } = input;
  const gray = await decodeImageBytes(bytes);
  const result = await analyseDrop(gray, {
    method: input.method,
    ...(input.baseline ? { baseline: input.baseline } : {}),
  });
  const { width, height } = gray;
  const b = result.baseline;
  const [[x0, y0], [xw, yw]] = baselineAcross(b, width);
  const len = Math.max(result.heightPx, result.baseDiameterPx / 3) * 0.9;
  const lt = tangentEnd(b, result.contactLeft, result.leftDeg, 'left', len);
  const rt = tangentEnd(b, result.contactRight, result.rightDeg, 'right', len);
  const dots = [...result.edgePoints.left, ...result.edgePoints.right]
    .filter((_, i) => i % 2 === 0)
    .map(([x, y]) => `<circle cx="${x.toFixed(1)}" cy="${y.toFixed(1)}" r="1.2" fill="#30b9b8"/>`)
    .join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">
${dots}
${result.profile ? `<polyline points="${result.profile.map(([x, y]) => `${x.toFixed(1)},${y.toFixed(1)}`).join(' ')}" fill="none" stroke="#e08a0b" stroke-width="1.5"/>` : ''}
<line x1="${x0}" y1="${y0.toFixed(1)}" x2="${xw}" y2="${yw.toFixed(1)}" stroke="#ecfbfa" stroke-width="3" opacity="0.7"/>
<line x1="${x0}" y1="${y0.toFixed(1)}" x2="${xw}" y2="${yw.toFixed(1)}" stroke="#134f52" stroke-width="1.5" stroke-dasharray="8 5"/>
<line x1="${result.contactLeft[0]}" y1="${result.contactLeft[1]}" x2="${lt[0]}" y2="${lt[1]}" stroke="#b32f1d" stroke-width="2"/>
<line x1="${result.contactRight[0]}" y1="${result.contactRight[1]}" x2="${rt[0]}" y2="${rt[1]}" stroke="#b32f1d" stroke-width="2"/>
</svg>`;
  // sharp reads every stored format but BMP; for BMP start from the decoded 8-bit pixels.
  const readable = await sharp(bytes)
    .metadata()
    .then(() => true)
    .catch(() => false);
  const base = readable
    ? sharp(bytes)
    : sharp(Buffer.from(gray.data.buffer, gray.data.byteOffset, gray.data.byteLength), {
        raw: { width, height, channels: 1 },
      });
  const png = await base
    .toColourspace('srgb')
    .composite([{ input: Buffer.from(svg), top: 0, left: 0 }])
    .png()
    .toBuffer();
  return { png, result };
}
