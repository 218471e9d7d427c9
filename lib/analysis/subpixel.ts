import { sampleBilinear, type PixelImage } from './image';

export interface EdgeCrossing {
  /** Offset of the edge along the search direction from the start point (px). */
  offset: number;
  /** Intensity rise across the edge (0–255 scale). */
  rise: number;
  /** Standard deviation of the gradient profile (px): the edge's blur width. */
  spread: number;
}

const STEP = 0.5;
// Scratch buffers reused by every call (the engine is single-threaded per worker or process).
let samples = new Float64Array(64);
let diffs = new Float64Array(64);

/**
 * Sub-pixel edge position along a line: the gradient-weighted centroid of the intensity derivative
 * along the direction (nx, ny), which points from dark to bright. Samples are averaged over ±1 px
 * along the edge (the tangent) to reduce noise without moving the edge. Only the run of positive
 * derivative around the strongest step counts, so neighbouring edges and noise do not pull it.
 */
export function edgeAlongNormal(
  image: PixelImage,
  px: number,
  py: number,
  nx: number,
  ny: number,
  halfWindow = 4,
): EdgeCrossing | null {
  const count = Math.round((2 * halfWindow) / STEP) + 1;
  if (samples.length < count) {
    samples = new Float64Array(count * 2);
    diffs = new Float64Array(count * 2);
  }
  const tx = -ny;
  const ty = nx;
  for (let k = 0; k < count; k++) {
    const t = -halfWindow + k * STEP;
    const x = px + t * nx;
    const y = py + t * ny;
    samples[k] =
      (sampleBilinear(image, x - tx, y - ty) +
        2 * sampleBilinear(image, x, y) +
        sampleBilinear(image, x + tx, y + ty)) /
      4;
  }
  let best = -1;
  let bestValue = 0;
  for (let k = 0; k < count - 1; k++) {
    const d = samples[k + 1] - samples[k];
    diffs[k] = d;
    if (d > bestValue) {
      bestValue = d;
      best = k;
    }
  }
  if (best < 0) return null;
  const floor = 0.1 * bestValue;
  let lo = best;
  while (lo > 0 && diffs[lo - 1] > floor) lo--;
  let hi = best;
  while (hi < count - 2 && diffs[hi + 1] > floor) hi++;
  let sw = 0;
  let st = 0;
  let st2 = 0;
  let rise = 0;
  for (let k = lo; k <= hi; k++) {
    const w = diffs[k] - floor;
    const t = -halfWindow + (k + 0.5) * STEP;
    sw += w;
    st += w * t;
    st2 += w * t * t;
    rise += diffs[k];
  }
  if (sw <= 0) return null;
  const offset = st / sw;
  return { offset, rise, spread: Math.sqrt(Math.max(st2 / sw - offset * offset, 0)) };
}
