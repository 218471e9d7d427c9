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

  it('circle, automatic and true baseline, small drops (β ≤ 0.1), 10°–170°: MAE ≤ 1°', () => {
    // The target. The cap is fitted next to the contact line, so gravity's flattening near
    // the apex no longer enters; what is left at β = 0.1 is the change of curvature between the
    // contact point and the first visible edge points (≈ 10° at 170°, see docs/analysis.md).
    const smallDrops = [...small, ...gravity.slice(0, 9)];
    const auto = evaluate(cv, smallDrops, 'circle', 'automatic');
    const given = evaluate(cv, smallDrops, 'circle', 'true');
    expect(auto.failures).toBe(0);
    expect(given.failures).toBe(0);
    expect(auto.maeDeg).toBeLessThanOrEqual(1);
    // "With the true baseline given, at least as good" (within 0.05° of rounding).
    expect(given.maeDeg).toBeLessThanOrEqual(Math.min(1, auto.maeDeg + 0.05));
  }, 240_000);

  it('circle on β ≤ 0.01 (negligible gravity) is within 0.5° MAE', () => {
    const s = evaluate(cv, small, 'circle', 'automatic');
    expect(s.maeDeg).toBeLessThanOrEqual(0.5);
  }, 120_000);

  it('circle on β = 0.1 stays within 1° up to 110°', () => {
    const s = evaluate(cv, gravity.slice(0, 6), 'circle', 'automatic');
    expect(s.maxDeg).toBeLessThanOrEqual(1);
  }, 120_000);

  it('polynomial tangent, automatic baseline, 10°–150°, β 0–1: MAE ≤ 1°', () => {
    // Local, so free of the shape assumption but noise-sensitive; at 170° its extrapolated tangent
    // can pass the horizontal (see docs/analysis-accuracy.md), so 170° is left out here.
    const cases = [...small, ...gravity].filter((r) => r.truth.contactAngleDeg <= 150);
    const s = evaluate(cv, cases, 'polynomial', 'automatic');
    expect(s.failures).toBe(0);
    expect(s.maeDeg).toBeLessThanOrEqual(1);
  }, 240_000);
});
