/**
 * The series result as the outside contract states it (issue 16, item 7; `npm run analyze-series`):
 *
 *   { frames: [{ index, tSec, leftDeg, rightDeg, meanDeg, baseDiameterPx, volumePx3, warnings }],
 *     advancing: { meanDeg, leftDeg, rightDeg, sdDeg, fromSec, toSec, frameCount } | null,
 *     receding: { … } | null, hysteresisDeg: number | null, warnings: [{ code, message }] }
 *
 * Exactly these keys, so a consumer can check the shape; numbers rounded to what they can carry.
 */
import type { DynamicSummary } from './phases';
import type { AngleWindowStats, SeriesFrame, SeriesWarning } from './types';

export type ContractFrame = Pick<
  SeriesFrame,
  | 'index'
  | 'tSec'
  | 'leftDeg'
  | 'rightDeg'
  | 'meanDeg'
  | 'baseDiameterPx'
  | 'volumePx3'
  | 'warnings'
>;

/** The window statistics, rounded. */
export type ContractStats = AngleWindowStats;

export interface SeriesReport {
  frames: ContractFrame[];
  advancing: ContractStats | null;
  receding: ContractStats | null;
  hysteresisDeg: number | null;
  warnings: SeriesWarning[];
}

const round = (value: number | null, digits: number): number | null =>
  value === null ? null : Number(value.toFixed(digits));

function stats(s: AngleWindowStats | null): ContractStats | null {
  if (!s) return null;
  return {
    meanDeg: round(s.meanDeg, 3) as number,
    leftDeg: round(s.leftDeg, 3) as number,
    rightDeg: round(s.rightDeg, 3) as number,
    sdDeg: round(s.sdDeg, 3),
    fromSec: round(s.fromSec, 4) as number,
    toSec: round(s.toSec, 4) as number,
    frameCount: s.frameCount,
  };
}

export function seriesReport(
  frames: readonly SeriesFrame[],
  summary: DynamicSummary,
): SeriesReport {
  return {
    frames: frames.map((f) => ({
      index: f.index,
      tSec: round(f.tSec, 4) as number,
      leftDeg: round(f.leftDeg, 3),
      rightDeg: round(f.rightDeg, 3),
      meanDeg: round(f.meanDeg, 3),
      baseDiameterPx: round(f.baseDiameterPx, 3),
      volumePx3: round(f.volumePx3, 1),
      warnings: f.warnings.map((w) => ({ code: w.code, message: w.message })),
    })),
    advancing: stats(summary.advancing),
    receding: stats(summary.receding),
    hysteresisDeg: round(summary.hysteresisDeg, 3),
    warnings: summary.warnings.map((w) => ({ code: w.code, message: w.message })),
  };
}
