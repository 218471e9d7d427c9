/**
 * Accuracy on generated photos with known truth (fixtures/generator: Young–Laplace profile,
 * supersampled, blurred, noisy, slightly tilted). Reference: the Young–Laplace (Bashforth–Adams)
 * profile the photos are rendered from — independent of the fits only through the image.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { loadOpenCv, type OpenCv } from '@/lib/analysis';
import { evaluate, renderCases, sweepCases } from '@/fixtures/generator/accuracy';
import type { RenderedDrop } from '@/fixtures/generator/render';

const ANGLES = [10, 30, 50, 70, 90, 110, 130, 150, 170];
let cv: OpenCv;
let gravity: RenderedDrop[];
let small: RenderedDrop[];

beforeAll(async () => {
  ({ cv } = await loadOpenCv());
  gravity = renderCases(sweepCases(ANGLES, [0.1, 0.5, 1]));
  small = renderCases(sweepCases(ANGLES, [0, 0.01]));
}, 120_000);

describe('accuracy on generated photos, 10°–170°', () => {
  it('Young–Laplace, automatic baseline, β 0.1–1: MAE ≤ 0.5°', () => {
    const s = evaluate(cv, gravity, 'young-laplace', 'automatic');
    expect(s.failures).toBe(0);
    expect(s.maeDeg).toBeLessThanOrEqual(0.5);
    expect(s.maxDeg).toBeLessThan(2);
  }, 120_000);

  it('Young–Laplace with the true baseline is at least as good', () => {
    const auto = evaluate(cv, gravity.slice(0, 9), 'young-laplace', 'automatic');
    const given = evaluate(cv, gravity.slice(0, 9), 'young-laplace', 'true');
    expect(given.failures).toBe(0);
    expect(given.maeDeg).toBeLessThanOrEqual(Math.min(0.5, auto.maeDeg + 0.05));
  }, 120_000);

  it('circle, automatic and true baseline, small drops (β ≤ 0.01): MAE ≤ 1°', () => {
    // The spherical cap is only right where gravity is negligible; at β = 0.1 the circle is off by
    // 1–18° above 90° (see docs/analysis-accuracy.md), a limit of the model, not of the pipeline.
    for (const baseline of ['automatic', 'true'] as const) {
      const s = evaluate(cv, small, 'circle', baseline);
      expect(s.failures).toBe(0);
      expect(s.maeDeg).toBeLessThanOrEqual(1);
    }
  }, 120_000);

  it('circle on β = 0.1 stays within 1° up to 90°', () => {
    const s = evaluate(cv, gravity.slice(0, 5), 'circle', 'automatic');
    expect(s.maxDeg).toBeLessThanOrEqual(1.5);
    expect(s.maeDeg).toBeLessThanOrEqual(1);
  }, 120_000);
});
