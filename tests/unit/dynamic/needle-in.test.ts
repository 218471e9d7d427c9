/**
 * Needle-in series (drop grown, then withdrawn through the needle left in it) analysed frame by
 * frame, against the generator's truth. Each frame is an exact Young–Laplace profile (Bashforth &
 * Adams, 1883; REFERENCES.md) whose Bond number follows from its size, rendered with 0.8 % noise.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { loadOpenCv, type OpenCv } from '@/lib/analysis';
import { analyseSeries, summariseDynamic, type SeriesFrame } from '@/lib/dynamic';
import {
  NEEDLE_SERIES,
  needleFrameCount,
  renderNeedleFrame,
  type NeedleFrameTruth,
  type SeriesFrame as RenderedFrame,
} from '@/fixtures/generator/series';
import { NEEDLE_IN_PHASES } from './committed';

let cv: OpenCv;
let rendered: RenderedFrame<NeedleFrameTruth>[];
let frames: SeriesFrame[];
const progress: number[] = [];

beforeAll(async () => {
  ({ cv } = await loadOpenCv());
  rendered = Array.from({ length: needleFrameCount(NEEDLE_SERIES) }, (_, i) =>
    renderNeedleFrame(NEEDLE_SERIES, i),
  );
  frames = await analyseSeries(
    cv,
    rendered.map((r) => ({ image: r.image, tSec: r.truth.tSec })),
    {
      method: 'young-laplace',
      onFrame: (frame, p) => {
        expect(p.total).toBe(rendered.length);
        progress.push(frame.index);
      },
    },
  );
}, 300_000);

describe('needle-in series, Young–Laplace', () => {
  it('reports every frame, in order, with progress after each', () => {
    expect(frames).toHaveLength(50);
    expect(frames.map((f) => f.index)).toEqual(rendered.map((_, i) => i));
    expect(progress).toEqual(frames.map((f) => f.index));
    expect(frames.map((f) => f.tSec)).toEqual(rendered.map((r) => r.truth.tSec));
  });

  it('measures every frame within 0.3° of the generated angle (Young–Laplace truth, REFERENCES.md)', () => {
    const errors = frames.map((f, i) => {
      const truth = rendered[i].truth.contactAngleDeg;
      return Math.max(
        Math.abs((f.leftDeg as number) - truth),
        Math.abs((f.rightDeg as number) - truth),
      );
    });
    expect(Math.max(...errors)).toBeLessThan(0.3);
  });

  it('measures base diameter within 0.5 px and volume within 0.5 % on every frame', () => {
    frames.forEach((f, i) => {
      expect(
        Math.abs((f.baseDiameterPx as number) - rendered[i].truth.baseDiameterPx),
      ).toBeLessThan(0.5);
      expect(Math.abs((f.volumePx3 as number) / rendered[i].truth.volumePx3 - 1)).toBeLessThan(
        0.005,
      );
    });
  });

  it('finds the pinned, advancing, pinned, receding phases where the generator put them', () => {
    const summary = summariseDynamic(frames);
    expect(summary.phases.segments.map((s) => s.kind)).toEqual(NEEDLE_IN_PHASES);
    // The contact line moves from the first frame after the growth (withdrawal) turned it loose;
    // the boundary may fall one frame either way.
    const movingFrames = (phase: 'advancing' | 'receding') =>
      rendered
        .filter(
          (r, i) =>
            r.truth.phase === phase &&
            i > 0 &&
            r.truth.baseDiameterPx !== rendered[i - 1].truth.baseDiameterPx,
        )
        .map((r) => r.truth.index);
    for (const phase of ['advancing', 'receding'] as const) {
      const truth = movingFrames(phase);
      const found = summary.phases.segments.find((s) => s.kind === phase)!;
      expect(Math.abs(found.fromIndex - truth[0])).toBeLessThanOrEqual(1);
      expect(Math.abs(found.toIndex - truth[truth.length - 1])).toBeLessThanOrEqual(1);
      const window = phase === 'advancing' ? summary.advancingWindow! : summary.recedingWindow!;
      // Every frame in the default window is one where the contact line truly moves.
      for (const r of rendered.filter(
        (r) => r.truth.tSec >= window.fromSec && r.truth.tSec <= window.toSec,
      ))
        expect(r.truth.phase).toBe(phase);
    }
  });

  it('gives advancing and receding within 0.5° of the generated angles (needle-in practice, ASTM D7334)', () => {
    const summary = summariseDynamic(frames);
    expect(summary.advancing).not.toBeNull();
    expect(summary.receding).not.toBeNull();
    expect(Math.abs(summary.advancing!.meanDeg - NEEDLE_SERIES.advancingDeg)).toBeLessThan(0.5);
    expect(Math.abs(summary.receding!.meanDeg - NEEDLE_SERIES.recedingDeg)).toBeLessThan(0.5);
    expect(
      Math.abs(summary.hysteresisDeg! - (NEEDLE_SERIES.advancingDeg - NEEDLE_SERIES.recedingDeg)),
    ).toBeLessThan(0.5);
    expect(summary.advancing!.frameCount).toBeGreaterThanOrEqual(10);
    expect(summary.receding!.frameCount).toBeGreaterThanOrEqual(10);
    expect(summary.advancing!.sdDeg).toBeLessThan(0.2);
    // The needle stays in the drop on purpose: it is flagged on each frame, not as a series problem.
    expect(frames.every((f) => f.warnings.some((w) => w.code === 'needle_in_contact'))).toBe(true);
    expect(summary.warnings).toEqual([]);
  });

  it('lets the caller move the windows and the numbers follow', () => {
    const summary = summariseDynamic(frames, {
      windows: { advancing: { fromSec: 0, toSec: 1.0 }, receding: null },
    });
    const expected = frames.filter((f) => f.tSec <= 1.0 + 1e-9);
    expect(summary.advancing!.frameCount).toBe(expected.length);
    expect(summary.advancing!.meanDeg).toBeCloseTo(
      expected.reduce((a, f) => a + (f.meanDeg as number), 0) / expected.length,
      10,
    );
    expect(summary.receding).toBeNull();
    expect(summary.hysteresisDeg).toBeNull();
    expect(summary.warnings.map((w) => w.code)).toContain('no_receding_phase');
  });

  it('tracks a region around the drop and keeps the checked baseline after the first frame', () => {
    expect(frames[0].tracking).toEqual({
      roi: null,
      baseline: 'found',
      retried: false,
      warmStart: false,
    });
    const later = frames.slice(1);
    expect(later.every((f) => f.tracking.roi !== null)).toBe(true);
    expect(later.filter((f) => f.tracking.baseline === 'kept').length).toBeGreaterThan(45);
    for (const f of later) {
      const roi = f.tracking.roi!;
      expect(roi.width * roi.height).toBeLessThan(0.5 * 640 * 480);
    }
  });
});

describe('needle-in series, polynomial tangent', () => {
  it('gives advancing and receding within 1° (the engine measures single drops to ~0.5–1.3° with it, docs/analysis-accuracy.md)', async () => {
    const poly = await analyseSeries(
      cv,
      rendered.map((r) => ({ image: r.image, tSec: r.truth.tSec })),
      { method: 'polynomial' },
    );
    const summary = summariseDynamic(poly);
    expect(Math.abs(summary.advancing!.meanDeg - NEEDLE_SERIES.advancingDeg)).toBeLessThan(1);
    expect(Math.abs(summary.receding!.meanDeg - NEEDLE_SERIES.recedingDeg)).toBeLessThan(1);
    expect(poly.every((f) => f.volumePx3 === null)).toBe(true);
  });
});
