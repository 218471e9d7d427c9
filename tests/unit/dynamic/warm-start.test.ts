/**
 * Warm starts in series tracking: each frame's Young–Laplace fit starts from the previous frame's
 * fit and stops by the same rules as a cold start, so it must land on the same minimum. Checked
 * frame by frame against the same series tracked with cold starts only, on the committed needle-in
 * frames (symmetric drops) and tilting-plate frames (asymmetric drops, the `stage`/`sides` models).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseDropWith, loadOpenCv, type GrayImage, type OpenCv } from '@/lib/analysis';
import { SeriesTracker, analyseSeries, type SeriesFrame } from '@/lib/dynamic';
import { committedSeries } from './committed';

/** Largest difference allowed between warm- and cold-started frames (degrees, each side). */
const AGREEMENT_DEG = 0.05;

let cv: OpenCv;
const images: Record<string, GrayImage[]> = {};

beforeAll(async () => {
  ({ cv } = await loadOpenCv());
  for (const name of ['needle-in', 'tilting-plate'])
    images[name] = await committedSeries(name).decodeFrames();
}, 120_000);

const track = (frames: GrayImage[], warmStart: boolean) =>
  analyseSeries(
    cv,
    frames.map((image, i) => ({ image, tSec: i / 5 })),
    { method: 'young-laplace', warmStart },
  );

function compare(warm: SeriesFrame[], cold: SeriesFrame[]) {
  expect(warm).toHaveLength(cold.length);
  let largest = 0;
  for (let i = 0; i < cold.length; i++) {
    expect(cold[i].tracking.warmStart).toBe(false);
    expect(warm[i].meanDeg).not.toBeNull();
    expect(cold[i].meanDeg).not.toBeNull();
    largest = Math.max(
      largest,
      Math.abs(warm[i].leftDeg! - cold[i].leftDeg!),
      Math.abs(warm[i].rightDeg! - cold[i].rightDeg!),
    );
    // A warm start never trades away the frame's flags.
    expect(warm[i].warnings.map((w) => w.code).sort()).toEqual(
      cold[i].warnings.map((w) => w.code).sort(),
    );
  }
  expect(largest).toBeLessThanOrEqual(AGREEMENT_DEG);
}

describe('warm starts from the previous frame (Young–Laplace)', () => {
  it(`agree with cold starts within ${AGREEMENT_DEG}° on every needle-in frame, and are used after the first`, async () => {
    const frames = images['needle-in'];
    const warm = await track(frames, true);
    const cold = await track(frames, false);
    compare(warm, cold);
    expect(warm[0].tracking.warmStart).toBe(false);
    // Never after a flagged frame (the needle in the drop is no flag); after an unflagged one it
    // may still fall back to a cold start, but rarely on these smoothly changing frames.
    let eligible = 0;
    for (let i = 1; i < warm.length; i++) {
      if (warm[i - 1].warnings.some((w) => w.code !== 'needle_in_contact'))
        expect(warm[i].tracking.warmStart).toBe(false);
      else eligible++;
    }
    expect(eligible).toBeGreaterThan(0.5 * (warm.length - 1));
    const used = warm.filter((f) => f.tracking.warmStart).length;
    expect(used).toBeGreaterThanOrEqual(0.8 * eligible);
  }, 300_000);

  it(`agree with cold starts within ${AGREEMENT_DEG}° on every tilting-plate frame; never after a flagged frame`, async () => {
    const frames = images['tilting-plate'];
    const warm = await track(frames, true);
    const cold = await track(frames, false);
    compare(warm, cold);
    for (let i = 1; i < warm.length; i++) {
      if (warm[i - 1].warnings.some((w) => w.code !== 'needle_in_contact'))
        expect(warm[i].tracking.warmStart).toBe(false);
    }
    expect(warm.some((f) => f.tracking.warmStart)).toBe(true);
  }, 300_000);

  it('falls back to a cold start, the same as a single photo, when the drop has jumped', () => {
    const frames = images['needle-in'];
    const tracker = new SeriesTracker(cv, { method: 'young-laplace', trackRegion: false });
    tracker.analyse(frames[5], 0, 0);
    const next = tracker.analyse(frames[6], 1, 0.2);
    expect(next.tracking.warmStart).toBe(true);
    // The drop moved 90 px: a fit started where the last one was ends far from it (or fails).
    const moved = shifted(frames[6], 90);
    const jumped = tracker.analyse(moved, 2, 0.4);
    expect(jumped.tracking.warmStart).toBe(false);
    const single = analyseDropWith(cv, moved, {
      method: 'young-laplace',
      baseline: jumped.baseline!,
    });
    expect(jumped.leftDeg).toBe(single.leftDeg);
    expect(jumped.rightDeg).toBe(single.rightDeg);
  });

  it('is not used by methods whose fit needs no start, and not after a failed frame', async () => {
    const frames = images['needle-in'].slice(0, 4);
    const poly = await analyseSeries(
      cv,
      frames.map((image, i) => ({ image, tSec: i })),
      { method: 'polynomial' },
    );
    expect(poly.every((f) => !f.tracking.warmStart)).toBe(true);
    const blank: GrayImage = { width: 320, height: 240, data: new Uint8Array(320 * 240).fill(230) };
    const withGap = await analyseSeries(
      cv,
      [frames[0], frames[1], blank, frames[2], frames[3]].map((image, i) => ({ image, tSec: i })),
      { method: 'young-laplace' },
    );
    expect(withGap.map((f) => f.tracking.warmStart)).toEqual([false, true, false, false, true]);
  }, 120_000);
});

/** The frame moved right by `dx` px (border columns repeated). */
function shifted(image: GrayImage, dx: number): GrayImage {
  const data = new Uint8Array(image.data.length);
  for (let y = 0; y < image.height; y++)
    for (let x = 0; x < image.width; x++)
      data[y * image.width + x] =
        image.data[y * image.width + Math.min(image.width - 1, Math.max(0, x - dx))];
  return { width: image.width, height: image.height, data };
}
