/**
 * Piecewise-straight segmentation of a sampled signal by optimal partitioning (B. Jackson et al.,
 * "An algorithm for optimal partitioning of data on an interval", IEEE Signal Processing Letters
 * 12, 2005): the split into segments that minimises Σ (SSR of a least-squares line per segment) / σ²
 * + penalty × (number of segments), found exactly by dynamic programming in O(n²) with prefix sums.
 * Breaks land on the frames where the slope changes, without the smearing of a moving window.
 */

export interface LineSegment {
  /** First and last sample (inclusive). */
  from: number;
  to: number;
  slope: number;
  /** Residual standard deviation of the segment's line (0 for two points). */
  residualSd: number;
  /** Σ (t − t̄)² over the segment, for the slope's standard error σ / √Sxx. */
  sxx: number;
}

export interface SegmentOptions {
  /** Noise standard deviation of y (same units). */
  sigma: number;
  /** Cost of one more segment, in units of σ² (default 4 ln n: a spurious break is rare). */
  penalty?: number;
  /** Fewest samples per segment (default 3). */
  minLength?: number;
}

export function segmentLines(
  t: readonly number[],
  y: readonly number[],
  options: SegmentOptions,
): LineSegment[] {
  const n = t.length;
  if (n === 0) return [];
  const minLength = Math.max(2, options.minLength ?? 3);
  const penalty = options.penalty ?? 4 * Math.log(Math.max(n, 2));
  const s2 = options.sigma ** 2;
  // Prefix sums of centred values (less cancellation).
  const t0 = t[0];
  const y0 = y.reduce((a, b) => a + b, 0) / n;
  const St = new Float64Array(n + 1);
  const Sy = new Float64Array(n + 1);
  const Stt = new Float64Array(n + 1);
  const Syy = new Float64Array(n + 1);
  const Sty = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) {
    const a = t[i] - t0;
    const b = y[i] - y0;
    St[i + 1] = St[i] + a;
    Sy[i + 1] = Sy[i] + b;
    Stt[i + 1] = Stt[i] + a * a;
    Syy[i + 1] = Syy[i] + b * b;
    Sty[i + 1] = Sty[i] + a * b;
  }
  /** Line fit of samples [i, j). */
  const line = (i: number, j: number) => {
    const m = j - i;
    const st = St[j] - St[i];
    const sy = Sy[j] - Sy[i];
    const sxx = Stt[j] - Stt[i] - (st * st) / m;
    const sxy = Sty[j] - Sty[i] - (st * sy) / m;
    const syy = Syy[j] - Syy[i] - (sy * sy) / m;
    const slope = sxx > 0 ? sxy / sxx : 0;
    const ssr = Math.max(0, sxx > 0 ? syy - sxy * slope : syy);
    return { ssr, slope, sxx, m };
  };
  if (n < minLength) {
    const l = line(0, n);
    return [{ from: 0, to: n - 1, slope: l.slope, residualSd: 0, sxx: l.sxx }];
  }
  const best = new Float64Array(n + 1).fill(Infinity);
  const start = new Int32Array(n + 1).fill(-1);
  best[0] = -penalty;
  for (let j = minLength; j <= n; j++) {
    for (let i = 0; i + minLength <= j; i++) {
      if (!Number.isFinite(best[i])) continue;
      const cost = best[i] + line(i, j).ssr / s2 + penalty;
      if (cost < best[j]) {
        best[j] = cost;
        start[j] = i;
      }
    }
  }
  const segments: LineSegment[] = [];
  for (let j = n; j > 0; j = start[j]) {
    const i = start[j];
    const l = line(i, j);
    segments.push({
      from: i,
      to: j - 1,
      slope: l.slope,
      residualSd: l.m > 2 ? Math.sqrt(l.ssr / (l.m - 2)) : 0,
      sxx: l.sxx,
    });
  }
  return segments.reverse();
}
