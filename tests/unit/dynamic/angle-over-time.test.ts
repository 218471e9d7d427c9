/**
 * Angle over time: a generated drop spreading while absorbed, with the known laws
 * θ(t) = 40° + 45° exp(−t / 8 s) and V(t) = 4 µL (1 − t / 40 s), first frame 0.2 s after landing,
 * 5 frames per second; each frame an exact Young–Laplace profile (Bashforth & Adams, 1883;
 * REFERENCES.md) whose Bond number follows from its size.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { loadOpenCv } from '@/lib/analysis';
import { analyseAngleOverTime, analyseSeries, fitLine, type SeriesFrame } from '@/lib/dynamic';
import {
  ABSORPTION_SERIES as spec,
  absorptionLaw,
  renderAbsorptionFrame,
  type DropFrameTruth,
} from '@/fixtures/generator/series';

let frames: SeriesFrame[];
let truth: DropFrameTruth[];

beforeAll(async () => {
  const { cv } = await loadOpenCv();
  const rendered = Array.from({ length: spec.frameCount }, (_, i) =>
    renderAbsorptionFrame(spec, i),
  );
  truth = rendered.map((r) => r.truth);
  frames = await analyseSeries(
    cv,
    rendered.map((r) => ({ image: r.image, tSec: r.truth.tSec })),
    { method: 'young-laplace', scalePxPerMm: spec.physics.scalePxPerMm },
  );
}, 300_000);

describe('angle over time', () => {
  it('gives θ(t), base(t) and volume(t) of every frame against the laws', () => {
    const result = analyseAngleOverTime(frames);
    expect(result.points).toHaveLength(spec.frameCount);
    result.points.forEach((p, i) => {
      const law = absorptionLaw(spec, p.tSec);
      expect(Math.abs(p.meanDeg - law.angleDeg)).toBeLessThan(0.3);
      expect(Math.abs(p.baseDiameterPx - truth[i].baseDiameterPx)).toBeLessThan(0.5);
      expect(
        Math.abs(p.volumePx3! / (law.volumeUl * spec.physics.scalePxPerMm ** 3) - 1),
      ).toBeLessThan(0.005);
    });
  });

  it('extrapolates the initial angle to t = 0 within 0.3° (straight line through the first 5 frames)', () => {
    const { initial } = analyseAngleOverTime(frames);
    // The line's own error on the exact law over t = 0.2…1.0 s is
    // Δθ/(2τ²)·(var t − mean(t)²) = 45/128 · (0.08 − 0.36) ≈ −0.1°; the rest is measurement.
    expect(initial!.degree).toBe(1);
    expect(initial!.frameCount).toBe(5);
    expect([initial!.fromSec, initial!.toSec]).toEqual([
      expect.closeTo(0.2, 9),
      expect.closeTo(1.0, 9),
    ]);
    expect(Math.abs(initial!.angleDeg - spec.initialAngleDeg)).toBeLessThan(0.3);
    expect(initial!.standardErrorDeg).toBeGreaterThan(0);
    expect(initial!.standardErrorDeg).toBeLessThan(0.3);
  });

  it('a quadratic through the first 8 frames takes up the curvature: within 0.3° as well', () => {
    const { initial } = analyseAngleOverTime(frames, { initialFrames: 8, initialDegree: 2 });
    expect(initial!.degree).toBe(2);
    expect(Math.abs(initial!.angleDeg - spec.initialAngleDeg)).toBeLessThan(0.3);
  });

  it('gives the rate over a chosen window within 3 standard errors of the law’s least-squares slope', () => {
    const window = { fromSec: 1, toSec: 3 };
    const { rate } = analyseAngleOverTime(frames, { rateWindow: window });
    const inside = truth.filter(
      (t) => t.tSec >= window.fromSec - 1e-9 && t.tSec <= window.toSec + 1e-9,
    );
    const exact = fitLine(
      inside.map((t) => t.tSec),
      inside.map((t) => absorptionLaw(spec, t.tSec).angleDeg),
    ).slope;
    expect(rate!.frameCount).toBe(inside.length);
    expect(Math.abs(rate!.degPerSec - exact)).toBeLessThan(
      Math.max(3 * rate!.standardErrorDegPerSec, 0.05),
    );
    // …and close to dθ/dt at the window's middle (−Δθ/τ · e^(−2/8) ≈ −4.38 °/s).
    expect(rate!.degPerSec).toBeCloseTo(absorptionLaw(spec, 2).angleRateDegPerSec, 1);
    // Volume falls at V₀/T = 0.1 µL/s = 1e5 px³/s at 100 px/mm.
    expect(rate!.volumePx3PerSec! / -1e5).toBeCloseTo(1, 2);
    expect(rate!.baseDiameterPxPerSec).toBeGreaterThan(0);
  });

  it('measures from the landing time given on the series clock', () => {
    const shifted = frames.map((f) => ({ ...f, tSec: f.tSec + 2 }));
    const direct = analyseAngleOverTime(frames).initial!;
    const moved = analyseAngleOverTime(shifted, { zeroSec: 2 }).initial!;
    expect(moved.angleDeg).toBeCloseTo(direct.angleDeg, 9);
    expect(analyseAngleOverTime(shifted, { zeroSec: 2 }).points[0].tSec).toBeCloseTo(0.2, 9);
  });

  it('says when too few frames follow the landing', () => {
    const result = analyseAngleOverTime(frames.slice(0, 2));
    expect(result.initial).toBeNull();
    expect(result.rate).toBeNull();
    expect(result.warnings.map((w) => w.code)).toEqual(['no_initial_angle', 'empty_window']);
  });
});
