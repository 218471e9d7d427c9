/**
 * Tilting plate: a generated series (fixtures/generator/series-tilt.ts) whose downhill front
 * creeps from 11.6° of tilt and whose whole contact line moves from the roll-off tilt 21.3° on;
 * 0.5° of tilt per frame. The halves of each drop are exact axisymmetric Young–Laplace profiles
 * (Bashforth & Adams, 1883; REFERENCES.md) with the downhill and uphill angles.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadOpenCv } from '@/lib/analysis';
import {
  TiltCsvError,
  analyseSeries,
  analyseTiltingPlate,
  tiltsFromCsv,
  tiltsFromRate,
  type SeriesFrame,
} from '@/lib/dynamic';
import {
  TILT_SERIES,
  renderTiltFrame,
  tiltCsv,
  type TiltFrameTruth,
} from '@/fixtures/generator/series-tilt';

let frames: SeriesFrame[];
let truth: TiltFrameTruth[];

beforeAll(async () => {
  const { cv } = await loadOpenCv();
  const rendered = Array.from({ length: TILT_SERIES.frameCount }, (_, i) =>
    renderTiltFrame(TILT_SERIES, i),
  );
  truth = rendered.map((r) => r.truth);
  // Per-side angles: the polynomial tangent (the axisymmetric fits give one angle for both sides).
  frames = await analyseSeries(
    cv,
    rendered.map((r) => ({ image: r.image, tSec: r.truth.tSec })),
    { method: 'polynomial' },
  );
}, 300_000);

const tilts = () =>
  tiltsFromRate(
    frames.map((f) => f.tSec),
    TILT_SERIES.tiltRateDegPerSec,
  );

describe('tilting plate', () => {
  it('finds the roll-off tilt and the downhill creep within a quarter of the tilt step (0.5° per frame)', () => {
    const result = analyseTiltingPlate(frames, tilts());
    expect(result.downhillSide).toBe('right');
    expect(result.downhillSideSource).toBe('from-angles');
    expect(Math.abs(result.rollOffTiltDeg! - TILT_SERIES.rollOffTiltDeg)).toBeLessThan(0.125);
    expect(Math.abs(result.downhillOnsetDeg! - TILT_SERIES.creepTiltDeg)).toBeLessThan(0.125);
    expect(result.uphillOnsetDeg).toBe(result.rollOffTiltDeg);
    expect(result.warnings).toEqual([]);
  });

  it('follows each contact point downhill: none before its onset, the generated shift after it', () => {
    const result = analyseTiltingPlate(frames, tilts());
    result.frames.forEach((f, i) => {
      const t = truth[i];
      const downhillTruth = t.contactRightX - truth[0].contactRightX;
      const uphillTruth = t.contactLeftX - truth[0].contactLeftX;
      expect(Math.abs(f.downhillShiftPx! - downhillTruth)).toBeLessThan(0.5);
      expect(Math.abs(f.uphillShiftPx! - uphillTruth)).toBeLessThan(0.5);
    });
  });

  it('gives downhill and uphill angles per frame within 2.5° and on average within 0.8°', () => {
    // The polynomial tangent's own accuracy on single symmetric drops is 0.1–2.1° between 90° and
    // 130° (docs/analysis-accuracy.md, β = 0.1), so per frame no better can be asked of it.
    const result = analyseTiltingPlate(frames, tilts(), { downhillSide: 'right' });
    const errors = result.frames.flatMap((f, i) => [
      Math.abs(f.downhillDeg! - truth[i].downhillDeg),
      Math.abs(f.uphillDeg! - truth[i].uphillDeg),
    ]);
    expect(Math.max(...errors)).toBeLessThan(2.5);
    expect(errors.reduce((a, b) => a + b) / errors.length).toBeLessThan(0.8);
  });

  it('reads the angles at roll-off within 2° of the advancing and receding angles', () => {
    const { atRollOff } = analyseTiltingPlate(frames, tilts());
    expect(Math.abs(atRollOff!.downhill.angleDeg - TILT_SERIES.advancingDeg)).toBeLessThan(2);
    expect(Math.abs(atRollOff!.uphill.angleDeg - TILT_SERIES.recedingDeg)).toBeLessThan(2);
    expect(atRollOff!.hysteresisDeg).toBeCloseTo(
      atRollOff!.downhill.angleDeg - atRollOff!.uphill.angleDeg,
      12,
    );
    expect(atRollOff!.uphill.standardErrorDeg).toBeGreaterThan(0);
  });

  it('says so when the drop has not slid by the end of the series', () => {
    const early = frames.filter((f) => f.tSec < 18);
    const result = analyseTiltingPlate(
      early,
      tiltsFromRate(
        early.map((f) => f.tSec),
        1,
      ),
    );
    expect(result.rollOffTiltDeg).toBeNull();
    expect(result.atRollOff).toBeNull();
    expect(result.warnings.map((w) => w.code)).toEqual(['no_roll_off']);
    expect(result.downhillOnsetDeg).not.toBeNull();
  });

  it('refuses a tilt list that does not match the frames', () => {
    expect(() => analyseTiltingPlate(frames, [1, 2, 3])).toThrow(/one tilt per frame/);
  });
});

describe('tilt per frame from a stage log', () => {
  const times = Array.from({ length: 31 }, (_, i) => i);

  it('reads the committed log (one row per frame) and agrees with the rate', () => {
    const csv = readFileSync(
      path.join(__dirname, '../../../fixtures/series/tilting-plate/tilt.csv'),
      'utf8',
    );
    expect(tiltsFromCsv(csv, times, { column: 'tilt_deg' })).toEqual(tiltsFromRate(times, 1));
  });

  it('interpolates at the frame times when a time column is named', () => {
    const csv = 'Time (s);Tilt\n0;0\n10;5\n20;20\n';
    expect(
      tiltsFromCsv(csv, [0, 5, 10, 15, 20], { column: 'tilt', timeColumn: 'time (s)' }),
    ).toEqual([0, 2.5, 5, 12.5, 20]);
  });

  it('explains what is wrong with a bad log', () => {
    expect(() => tiltsFromCsv('a,b\n1,2\n', [0], { column: 'tilt' })).toThrow(/no column "tilt"/);
    expect(() => tiltsFromCsv('tilt\n1\n2\n', [0], { column: 'tilt' })).toThrow(
      /2 rows but the series has 1 frames/,
    );
    expect(() => tiltsFromCsv('tilt\nabc\n', [0], { column: 'tilt' })).toThrow(TiltCsvError);
    expect(() =>
      tiltsFromCsv('t,tilt\n0,0\n1,1\n', [0, 2], { column: 'tilt', timeColumn: 't' }),
    ).toThrow(/outside the tilt log/);
    expect(() => tiltsFromRate([0, 1], 0)).toThrow(/non-zero/);
  });

  it('the generator writes the same log as the committed one', () => {
    const committed = readFileSync(
      path.join(__dirname, '../../../fixtures/series/tilting-plate/tilt.csv'),
      'utf8',
    );
    expect(committed).toBe(tiltCsv({ ...TILT_SERIES, fps: 1, frameCount: 31 }));
  });
});
