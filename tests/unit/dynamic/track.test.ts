/**
 * Frame-to-frame tracking on the committed needle-in frames (generated, truth in the manifest):
 * the kept-baseline check, the region around the drop, the second chance on the whole frame, and
 * frames that cannot be analysed keeping their place.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { loadOpenCv, type GrayImage, type OpenCv } from '@/lib/analysis';
import {
  SeriesTracker,
  analyseSeries,
  baselineStillFits,
  frameTimes,
  regionAround,
  summariseDynamic,
} from '@/lib/dynamic';
import { committedSeries } from './committed';

const series = committedSeries('needle-in');
const manifest = series.manifest as unknown as {
  frames: { contactLeftX: number; contactRightX: number; heightPx: number }[];
};
/** The committed frames are drawn with the baseline at y = 180 (layout 320×240). */
const BASELINE = { x1: 0, y1: 180, x2: 319, y2: 180 };

let cv: OpenCv;
let images: GrayImage[];

beforeAll(async () => {
  ({ cv } = await loadOpenCv());
  images = await series.decodeFrames();
});

/** The frame moved right by `dx` px (border columns repeated: backlight, substrate and needle shift). */
function shifted(image: GrayImage, dx: number): GrayImage {
  const data = new Uint8Array(image.data.length);
  for (let y = 0; y < image.height; y++)
    for (let x = 0; x < image.width; x++)
      data[y * image.width + x] =
        image.data[y * image.width + Math.min(image.width - 1, Math.max(0, x - dx))];
  return { width: image.width, height: image.height, data };
}

describe('kept baseline', () => {
  it('holds on the true baseline and within a few tenths of a pixel of it, not 1 px off', () => {
    const contacts: [number, number] = [
      manifest.frames[10].contactLeftX,
      manifest.frames[10].contactRightX,
    ];
    const at = (dy: number) => ({ ...BASELINE, y1: BASELINE.y1 + dy, y2: BASELINE.y2 + dy });
    expect(baselineStillFits(images[10], at(0), contacts, null)).toBe(true);
    expect(baselineStillFits(images[10], at(0.2), contacts, null)).toBe(true);
    expect(baselineStillFits(images[10], at(1), contacts, null)).toBe(false);
    expect(baselineStillFits(images[10], at(-1), contacts, null)).toBe(false);
    // Tilted by 1 px over the frame: one side is off by more than the tolerance.
    expect(baselineStillFits(images[10], { ...BASELINE, y2: 181.5 }, contacts, null)).toBe(false);
  });

  it('is not kept when there is no substrate to check beside the drop', () => {
    expect(baselineStillFits(images[10], BASELINE, [2, 317], null)).toBe(false);
  });
});

describe('region around the drop', () => {
  it('holds the drop with room on every side and stays inside the image', async () => {
    const [frame] = await analyseSeries(cv, [{ image: images[14], tSec: 0 }]);
    const roi = regionAround(frame.analysis!, images[14]);
    const t = manifest.frames[14];
    expect(roi.x).toBeLessThan(t.contactLeftX - 20);
    expect(roi.x + roi.width).toBeGreaterThan(t.contactRightX + 20);
    expect(roi.y).toBeLessThan(180 - t.heightPx - 20);
    expect(roi.y + roi.height).toBeGreaterThan(180 + 20);
    expect(roi.x).toBeGreaterThanOrEqual(0);
    expect(roi.y).toBeGreaterThanOrEqual(0);
    expect(roi.x + roi.width).toBeLessThanOrEqual(320);
    expect(roi.y + roi.height).toBeLessThanOrEqual(240);
  });
});

describe('tracker', () => {
  it('analyses the frame again on the whole image when the drop has left the region', () => {
    const tracker = new SeriesTracker(cv);
    const first = tracker.analyse(images[5], 0, 0);
    const moved = tracker.analyse(shifted(images[5], 90), 1, 0.1);
    expect(first.tracking.retried).toBe(false);
    expect(moved.tracking.retried).toBe(true);
    expect(moved.tracking.roi).toBeNull();
    expect(moved.meanDeg).toBeCloseTo(first.meanDeg!, 1);
    expect(moved.contactLeft![0] - first.contactLeft![0]).toBeCloseTo(90, 0);
  });

  it('keeps a frame it cannot analyse, with null values and the reason, and goes on', async () => {
    const blank: GrayImage = { width: 320, height: 240, data: new Uint8Array(320 * 240).fill(230) };
    const input = [images[0], blank, images[2]];
    const times = frameTimes(input.length, 3);
    const frames = await analyseSeries(
      cv,
      input.map((image, i) => ({ image, tSec: times[i] })),
    );
    expect(frames.map((f) => f.index)).toEqual([0, 1, 2]);
    expect(frames[1].meanDeg).toBeNull();
    expect(frames[1].baseDiameterPx).toBeNull();
    expect(frames[1].warnings).toHaveLength(1);
    expect(['baseline_not_found', 'no_drop_found']).toContain(frames[1].warnings[0].code);
    expect(frames[1].tracking.retried).toBe(true);
    expect(frames[2].meanDeg).not.toBeNull();
    const notes = summariseDynamic(frames).warnings;
    expect(notes.find((w) => w.code === 'frames_failed')?.message).toMatch(
      /1 of 3 frames .*frames 1\)/,
    );
  });

  it('uses a given baseline on every frame, and the whole frame when region tracking is off', async () => {
    const frames = await analyseSeries(
      cv,
      images.slice(0, 4).map((image, i) => ({ image, tSec: i })),
      { baseline: BASELINE, trackRegion: false, method: 'circle' },
    );
    for (const f of frames) {
      expect(f.tracking).toEqual({
        roi: null,
        baseline: 'given',
        retried: false,
        warmStart: false,
      });
      expect(f.baseline).toEqual(BASELINE);
    }
  });

  it('stops when cancelled and reports what it has', async () => {
    let done = 0;
    const frames = await analyseSeries(
      cv,
      images.slice(0, 6).map((image, i) => ({ image, tSec: i })),
      { method: 'circle', onFrame: () => done++, cancelled: () => done >= 2 },
    );
    expect(frames).toHaveLength(2);
  });

  it('frame times from a frame rate', () => {
    expect(frameTimes(3, 4, 1)).toEqual([1, 1.25, 1.5]);
    expect(() => frameTimes(3, 0)).toThrow(/positive/);
  });
});
