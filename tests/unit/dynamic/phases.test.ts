/**
 * Phase detection on synthetic base-diameter curves with known breaks and seeded Gaussian noise
 * (tests from known shapes: generate the truth, degrade it, recover it within a stated tolerance),
 * and the least-squares tools under it, checked against the textbook closed forms (ordinary least
 * squares for a line: Draper & Smith, Applied Regression Analysis, ch. 1), derived here independently.
 */
import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';
import {
  detectPhases,
  fitLine,
  frameWarnings,
  isFlagged,
  fitPolynomial,
  noiseFromSecondDifferences,
  segmentLines,
  summariseDynamic,
  windowStats,
  type SeriesFrame,
} from '@/lib/dynamic';
import { NEEDLE_IN_PHASES } from './committed';

function gaussian(seed: string): () => number {
  const uniform = seedrandom(seed);
  return () => {
    const u = Math.max(uniform(), 1e-12);
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * uniform());
  };
}

/** Base diameter: pinned, advancing, pinned, receding (frame counts), px and px/frame. */
function needleCurve(
  counts: [number, number, number, number],
  speed: number,
  noise: number,
  seed: string,
) {
  const normal = gaussian(seed);
  const truth: ('pinned' | 'advancing' | 'receding')[] = [];
  const base: number[] = [];
  let b = 200;
  const phases = ['pinned', 'advancing', 'pinned', 'receding'] as const;
  phases.forEach((phase, k) => {
    for (let i = 0; i < counts[k]; i++) {
      if (phase === 'advancing') b += speed;
      if (phase === 'receding') b -= speed;
      truth.push(phase);
      base.push(b + noise * normal());
    }
  });
  return { truth, base };
}

const fps = 10;
function framesOf(base: (number | null)[], volume?: (number | null)[]): SeriesFrame[] {
  return base.map((b, index) => ({
    index,
    tSec: index / fps,
    leftDeg: b === null ? null : 100,
    rightDeg: b === null ? null : 100,
    meanDeg: b === null ? null : 100,
    baseDiameterPx: b,
    heightPx: null,
    volumePx3: volume ? volume[index] : null,
    contactLeft: null,
    contactRight: null,
    baseline: null,
    warnings: [],
    tracking: { roi: null, baseline: 'found', retried: false, warmStart: false },
    analysis: null,
    timeMs: 0,
  }));
}

describe('phase detection on noisy base-diameter curves', () => {
  for (const [noise, speed] of [
    [0.05, 1],
    [0.3, 1],
    [1, 2],
  ] as const) {
    // A break is placed to about one frame (the frame at the kink fits either piece) plus 3σ / speed.
    const tolerance = 1 + Math.ceil((3 * noise) / speed);
    it(`finds the four phases within ${tolerance} frames at noise ${noise} px, speed ${speed} px/frame`, () => {
      const estimates: number[] = [];
      for (const seed of ['a', 'b', 'c', 'd', 'e', 'f']) {
        const { truth, base } = needleCurve([20, 40, 25, 40], speed, noise, `${noise}-${seed}`);
        const found = detectPhases(framesOf(base));
        expect(found.segments.map((s) => s.kind)).toEqual(NEEDLE_IN_PHASES);
        const boundaries = [20, 60, 85];
        found.segments.slice(1).forEach((s, k) => {
          expect(Math.abs(s.fromIndex - boundaries[k])).toBeLessThanOrEqual(tolerance);
        });
        // Default windows lie inside the true phases.
        for (const [window, phase] of [
          [found.advancingWindow!, 'advancing'],
          [found.recedingWindow!, 'receding'],
        ] as const) {
          for (let i = Math.round(window.fromSec * fps); i <= Math.round(window.toSec * fps); i++)
            expect(truth[i]).toBe(phase);
        }
        estimates.push(found.baseNoisePx / noise);
      }
      // The noise estimate from second differences: within 20 % of the truth on average.
      const average = estimates.reduce((a, b) => a + b) / estimates.length;
      expect(Math.abs(average - 1)).toBeLessThan(0.2);
    });
  }

  it('keeps a slow drift of the base while pinned (below 1 px over the phase) pinned', () => {
    const { base } = needleCurve([30, 30, 30, 30], 1.5, 0.02, 'drift');
    const drifted = base.map((b, i) => b + 0.008 * i);
    const kinds = detectPhases(framesOf(drifted)).segments.map((s) => s.kind);
    expect(kinds).toEqual(['pinned', 'advancing', 'pinned', 'receding']);
  });

  it('calls a noisy but still base pinned throughout', () => {
    const normal = gaussian('still');
    const base = Array.from({ length: 80 }, () => 150 + 0.5 * normal());
    const found = detectPhases(framesOf(base));
    expect(found.segments.map((s) => s.kind)).toEqual(['pinned']);
    const summary = summariseDynamic(framesOf(base));
    expect(summary.advancing).toBeNull();
    expect(summary.receding).toBeNull();
    expect(summary.warnings.map((w) => w.code)).toEqual([
      'no_advancing_phase',
      'no_receding_phase',
    ]);
  });

  it('skips frames without a base, keeps their place and says so', () => {
    const { base } = needleCurve([15, 30, 15, 30], 1, 0.1, 'gaps');
    const withGaps: (number | null)[] = base.map((b, i) => (i % 17 === 5 ? null : b));
    const frames = framesOf(withGaps);
    const found = detectPhases(frames);
    expect(found.segments.map((s) => s.kind)).toEqual(NEEDLE_IN_PHASES);
    expect(found.baseRatePxPerSec[5]).toBeNull();
    const summary = summariseDynamic(frames);
    const failed = summary.warnings.find((w) => w.code === 'frames_failed');
    expect(failed?.message).toMatch(/5 of 90 frames/);
    expect(failed?.message).toMatch(/5, 22, 39, 56, 73/);
  });

  it('warns when the base grows while the volume falls (sliding or spreading, not grown)', () => {
    const base = Array.from({ length: 40 }, (_, i) => 200 + (i >= 10 ? i - 10 : 0));
    const volume = base.map((_, i) => 1e6 * (1 - 0.005 * i));
    const found = detectPhases(framesOf(base, volume));
    expect(found.warnings.map((w) => w.code)).toEqual(['phase_volume_disagree']);
  });

  it('says when a series is too short', () => {
    const found = detectPhases(framesOf([100, 101, 102]));
    expect(found.segments).toEqual([]);
    expect(found.warnings.map((w) => w.code)).toEqual(['too_few_frames']);
  });

  it('window statistics: mean, per-side means, sample SD, times of the frames counted', () => {
    const frames = framesOf([1, 1, 1, 1, 1]).map((f, i) => ({
      ...f,
      leftDeg: 100 + i,
      rightDeg: 102 + i,
      meanDeg: 101 + i,
    }));
    const s = windowStats(frames, { fromSec: 0.1, toSec: 0.35 })!;
    expect(s.frameCount).toBe(3);
    expect(s.meanDeg).toBeCloseTo(103, 12);
    expect(s.leftDeg).toBeCloseTo(102, 12);
    expect(s.rightDeg).toBeCloseTo(104, 12);
    expect(s.sdDeg).toBeCloseTo(1, 12); // values 102, 103, 104
    expect([s.fromSec, s.toSec]).toEqual([0.1, 0.3]);
    expect(windowStats(frames, { fromSec: 5, toSec: 6 })).toBeNull();
  });
});

describe('straight-piece segmentation', () => {
  it('puts the breaks of an exact piecewise-straight signal on the kinks', () => {
    const t = Array.from({ length: 60 }, (_, i) => i);
    // Kinks between samples (at 19.5 and 44.5), so each sample belongs to one piece only.
    const y = t.map((x) => (x < 20 ? 5 : x < 45 ? 5 + 2 * (x - 19.5) : 55 - 0.5 * (x - 44.5)));
    const pieces = segmentLines(t, y, { sigma: 0.01 });
    expect(pieces.map((p) => [p.from, p.to])).toEqual([
      [0, 19],
      [20, 44],
      [45, 59],
    ]);
    expect(pieces.map((p) => p.slope)).toEqual([
      expect.closeTo(0, 9),
      expect.closeTo(2, 9),
      expect.closeTo(-0.5, 9),
    ]);
  });
});

describe('least squares', () => {
  it('line: slope, intercept and their standard errors match the closed forms', () => {
    const x = [0.5, 1.1, 2.3, 2.9, 4.2, 5.0, 6.4];
    const y = [3.1, 3.9, 6.2, 6.8, 9.9, 11.2, 13.7];
    const n = x.length;
    const mx = x.reduce((a, b) => a + b) / n;
    const my = y.reduce((a, b) => a + b) / n;
    const sxx = x.reduce((a, v) => a + (v - mx) ** 2, 0);
    const sxy = x.reduce((a, v, i) => a + (v - mx) * (y[i] - my), 0);
    const b1 = sxy / sxx;
    const b0 = my - b1 * mx;
    const s2 = y.reduce((a, v, i) => a + (v - b0 - b1 * x[i]) ** 2, 0) / (n - 2);
    const fit = fitLine(x, y);
    expect(fit.slope).toBeCloseTo(b1, 12);
    expect(fit.intercept).toBeCloseTo(b0, 12);
    expect(fit.slopeSe).toBeCloseTo(Math.sqrt(s2 / sxx), 12);
    expect(fit.interceptSe).toBeCloseTo(Math.sqrt(s2 * (1 / n + (mx * mx) / sxx)), 12);
  });

  it('quadratic through exact points returns its coefficients; origin shifts the intercept', () => {
    const x = [1, 2, 3, 4, 5, 6];
    const y = x.map((v) => 2 - 3 * v + 0.25 * v * v);
    const fit = fitPolynomial(x, y, 2);
    expect(fit.coefficients[0]).toBeCloseTo(2, 10);
    expect(fit.coefficients[1]).toBeCloseTo(-3, 10);
    expect(fit.coefficients[2]).toBeCloseTo(0.25, 10);
    // Around x = 2: 2 − 6 + 1 = −3, slope −3 + 1 = −2.
    const shifted = fitPolynomial(x, y, 2, 2);
    expect(shifted.coefficients[0]).toBeCloseTo(-3, 10);
    expect(shifted.coefficients[1]).toBeCloseTo(-2, 10);
    expect(() => fitPolynomial([1, 2], [1, 2], 2)).toThrow(/at least 3 points/);
  });

  it('noise from second differences recovers the SD of white noise on a straight trend', () => {
    const normal = gaussian('noise');
    const y = Array.from({ length: 4000 }, (_, i) => 3 + 0.7 * i + 0.4 * normal());
    expect(noiseFromSecondDifferences(y)).toBeGreaterThan(0.38);
    expect(noiseFromSecondDifferences(y)).toBeLessThan(0.42);
  });
});

describe('which frames are flagged', () => {
  const frame = (index: number, codes: string[], meanDeg: number | null = 95) =>
    ({
      index,
      meanDeg,
      warnings: codes.map((code) => ({ code, message: code })),
    }) as unknown as SeriesFrame;

  it('expects the needle in every series and differing sides on a tilting plate only', () => {
    const sides = frame(0, ['left_right_disagree']);
    expect(isFlagged(frame(0, ['needle_in_contact']))).toBe(false);
    expect(isFlagged(sides)).toBe(true);
    expect(isFlagged(sides, 'grow-and-withdraw')).toBe(true);
    // Downhill and uphill angles differ on a tilted drop: that is the measurement, not a fault.
    expect(isFlagged(sides, 'tilt')).toBe(false);
    expect(isFlagged(frame(0, ['left_right_disagree', 'baseline_off_contact']), 'tilt')).toBe(true);
    expect(isFlagged(frame(0, [], null), 'tilt')).toBe(true);
  });

  it('counts the flagged frames of a series by its kind', () => {
    const frames = [
      frame(0, []),
      frame(1, ['left_right_disagree']),
      frame(2, ['left_right_disagree']),
    ];
    expect(frameWarnings(frames, 'tilt')).toEqual([]);
    expect(frameWarnings(frames)[0]?.code).toBe('frames_flagged');
    expect(frameWarnings(frames)[0]?.message).toContain('2 analysed frames');
  });
});
