/**
 * One dynamic measurement from an analysed series, by its kind: advancing and receding angles and
 * hysteresis (a drop grown and/or withdrawn), the tilting-plate roll-off, or angle over time. The
 * browser's worker and the server's re-analysis both call this, so the numbers a user sees are the
 * numbers that are saved. Plain data in and out.
 */
import {
  analyseAngleOverTime,
  type AngleOverTimeOptions,
  type InitialAngle,
  type RateOverWindow,
} from './angle-over-time';
import { isFlagged, summariseDynamic, type PhaseSegment } from './phases';
import type { ContractFrame } from './report';
import { analyseTiltingPlate, type DropSide } from './tilt';
import type { AngleWindowStats, PhaseWindow, SeriesFrame, SeriesWarning } from './types';

/** What a series was taken for. */
export const DYNAMIC_KINDS = [
  'grow-and-withdraw',
  'growing',
  'shrinking',
  'tilt',
  'over-time',
] as const;
export type DynamicKind = (typeof DYNAMIC_KINDS)[number];

export interface MeasurementOptions {
  /** Windows chosen by the user (null: no such phase); left out: the detected ones. */
  windows?: { advancing?: PhaseWindow | null; receding?: PhaseWindow | null };
  /** Tilt of each frame (°), for kind `tilt`. */
  tiltsDeg?: readonly number[];
  downhillSide?: DropSide;
  overTime?: AngleOverTimeOptions;
}

export interface RollOff {
  tiltDeg: number;
  downhillDeg: number;
  downhillSeDeg: number;
  uphillDeg: number;
  uphillSeDeg: number;
  hysteresisDeg: number;
  downhillSide: DropSide;
}

/** One frame as kept with a saved measurement (no outline, no edge points). */
export type KeptSeriesFrame = ContractFrame & { tiltDeg: number | null };

export interface MeasurementResult {
  kind: DynamicKind;
  advancing: AngleWindowStats | null;
  receding: AngleWindowStats | null;
  hysteresisDeg: number | null;
  advancingWindow: PhaseWindow | null;
  recedingWindow: PhaseWindow | null;
  phases: PhaseSegment[];
  rollOff: RollOff | null;
  initialAngle: InitialAngle | null;
  rate: RateOverWindow | null;
  frameCount: number;
  failedFrameCount: number;
  /** Analysed frames with a warning other than the needle in the drop. */
  flaggedFrameCount: number;
  warnings: SeriesWarning[];
}

/** A frame needs a look when it failed or carries a warning other than the needle in the drop. */
export { isFlagged };

export function keptFrames(
  frames: readonly SeriesFrame[],
  tiltsDeg?: readonly number[],
): KeptSeriesFrame[] {
  return frames.map((f, i) => ({
    index: f.index,
    tSec: f.tSec,
    leftDeg: f.leftDeg,
    rightDeg: f.rightDeg,
    meanDeg: f.meanDeg,
    baseDiameterPx: f.baseDiameterPx,
    volumePx3: f.volumePx3,
    tiltDeg: tiltsDeg?.[i] ?? null,
    warnings: f.warnings,
  }));
}

/** The measurement's numbers from its analysed frames. */
export function summariseMeasurement(
  frames: readonly SeriesFrame[],
  kind: DynamicKind,
  options: MeasurementOptions = {},
): MeasurementResult {
  const summary = summariseDynamic(frames, {
    kind,
    windows: {
      // A growing series has no receding window to look for, and a shrinking one no advancing.
      ...(kind === 'growing' ? { receding: null } : {}),
      ...(kind === 'shrinking' ? { advancing: null } : {}),
      ...options.windows,
    },
  });
  const failedFrameCount = frames.filter((f) => f.meanDeg === null).length;
  const base: MeasurementResult = {
    kind,
    advancing: summary.advancing,
    receding: summary.receding,
    hysteresisDeg: summary.hysteresisDeg,
    advancingWindow: summary.advancingWindow,
    recedingWindow: summary.recedingWindow,
    phases: summary.phases.segments,
    rollOff: null,
    initialAngle: null,
    rate: null,
    frameCount: frames.length,
    failedFrameCount,
    flaggedFrameCount: frames.filter((f) => f.meanDeg !== null && isFlagged(f, kind)).length,
    // Warnings about the phase a kind does not look for say nothing.
    warnings: summary.warnings.filter(
      (w) =>
        !(kind === 'growing' && w.code === 'no_receding_phase') &&
        !(kind === 'shrinking' && w.code === 'no_advancing_phase'),
    ),
  };
  if (kind === 'tilt') {
    if (!options.tiltsDeg)
      throw new RangeError('A tilting-plate series needs the tilt of every frame.');
    const tilt = analyseTiltingPlate(frames, options.tiltsDeg, {
      ...(options.downhillSide ? { downhillSide: options.downhillSide } : {}),
    });
    const at = tilt.atRollOff;
    return {
      ...base,
      // On a tilting plate the downhill and uphill angles at roll-off are the advancing and
      // receding angles; the base-diameter phases mean nothing there.
      advancing: null,
      receding: null,
      hysteresisDeg: at ? at.hysteresisDeg : null,
      advancingWindow: null,
      recedingWindow: null,
      phases: [],
      rollOff:
        tilt.rollOffTiltDeg !== null && at
          ? {
              tiltDeg: tilt.rollOffTiltDeg,
              downhillDeg: at.downhill.angleDeg,
              downhillSeDeg: at.downhill.standardErrorDeg,
              uphillDeg: at.uphill.angleDeg,
              uphillSeDeg: at.uphill.standardErrorDeg,
              hysteresisDeg: at.hysteresisDeg,
              downhillSide: tilt.downhillSide,
            }
          : null,
      warnings: [...frameNotes(base.warnings), ...tilt.warnings],
    };
  }
  if (kind === 'over-time') {
    const over = analyseAngleOverTime(frames, options.overTime);
    return {
      ...base,
      advancing: null,
      receding: null,
      hysteresisDeg: null,
      advancingWindow: null,
      recedingWindow: null,
      initialAngle: over.initial,
      rate: over.rate,
      warnings: [...frameNotes(base.warnings), ...over.warnings],
    };
  }
  return base;
}

/** The series-level notes about frames, without those about contact-line phases. */
function frameNotes(warnings: readonly SeriesWarning[]): SeriesWarning[] {
  return warnings.filter((w) => w.code === 'frames_failed' || w.code === 'frames_flagged');
}
