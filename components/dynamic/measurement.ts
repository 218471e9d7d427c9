/**
 * The page's numbers from the analysed frames and the editor's choices, with lib/dynamic's own
 * `summariseMeasurement` (the function the server's re-analysis calls), and the same choices in
 * the shape the save request takes, so what is saved is what is shown.
 */
import type { SaveDynamicInput } from '@/lib/contracts/dynamic';
import {
  summariseMeasurement,
  type DynamicKind,
  type MeasurementOptions,
  type MeasurementResult,
} from '@/lib/dynamic/measurement';
import { tiltsFromCsv } from '@/lib/dynamic/tilt-csv';
import { tiltsFromRate, type DropSide } from '@/lib/dynamic/tilt';
import type { PhaseWindow, SeriesFrame } from '@/lib/dynamic/types';
import type { SeriesFrameResult } from '@/lib/dynamic/worker-protocol';
import type { TiltSource, WindowName } from './store';

export interface EditorChoices {
  kind: DynamicKind;
  windows: Partial<Record<WindowName, PhaseWindow | null>>;
  tilt: TiltSource;
  downhillSide: DropSide | 'auto';
  initialFrames: number;
  initialDegree: 1 | 2;
}

export type SaveChoices = Pick<
  SaveDynamicInput,
  'kind' | 'windows' | 'tilt' | 'downhillSide' | 'overTime'
>;

export type PageMeasurement =
  | {
      ok: true;
      result: MeasurementResult;
      /** Tilt of each frame (°) on a tilting-plate series, else null. */
      tiltsDeg: number[] | null;
      save: SaveChoices;
    }
  | { ok: false; message: string };

/** The tilt of each frame from a typed rate or a CSV column; throws with what to do. */
export function tiltsOf(tilt: TiltSource, times: readonly number[]): number[] {
  if (tilt.type === 'rate') {
    const rate = Number(tilt.rateDegPerSec);
    const start = tilt.startDeg.trim() === '' ? 0 : Number(tilt.startDeg);
    if (!Number.isFinite(rate) || rate === 0)
      throw new RangeError('Type the tilt rate in °/s (a number other than 0).');
    if (!Number.isFinite(start)) throw new RangeError('Type the starting tilt in degrees.');
    return tiltsFromRate(times, rate, start);
  }
  if (!tilt.text) throw new RangeError('Choose the CSV file with the stage tilt.');
  if (!tilt.column.trim()) throw new RangeError('Type the header of the tilt column.');
  return tiltsFromCsv(tilt.text, times, {
    column: tilt.column,
    ...(tilt.timeColumn.trim() ? { timeColumn: tilt.timeColumn } : {}),
  });
}

/** The measurement the page shows, or why it cannot be computed yet. */
export function pageMeasurement(
  frames: readonly SeriesFrameResult[],
  choices: EditorChoices,
): PageMeasurement {
  if (frames.length === 0) return { ok: false, message: 'No frame analysed yet.' };
  const series: SeriesFrame[] = frames.map((f) => ({ ...f, analysis: null }));
  const { kind } = choices;
  const options: MeasurementOptions = {};
  const save: SaveChoices = { kind };
  let tiltsDeg: number[] | null = null;
  try {
    if (kind === 'tilt') {
      tiltsDeg = tiltsOf(
        choices.tilt,
        series.map((f) => f.tSec),
      );
      options.tiltsDeg = tiltsDeg;
      save.tilt =
        choices.tilt.type === 'rate'
          ? {
              rateDegPerSec: Number(choices.tilt.rateDegPerSec),
              startDeg: Number(choices.tilt.startDeg || 0),
            }
          : { tiltsDeg };
      if (choices.downhillSide !== 'auto') {
        options.downhillSide = choices.downhillSide;
        save.downhillSide = choices.downhillSide;
      }
    } else if (kind === 'over-time') {
      options.overTime = {
        initialFrames: choices.initialFrames,
        initialDegree: choices.initialDegree,
        ...(choices.windows.rate ? { rateWindow: choices.windows.rate } : {}),
      };
      save.overTime = options.overTime;
    } else {
      const windows: NonNullable<MeasurementOptions['windows']> = {};
      if (choices.windows.advancing !== undefined) windows.advancing = choices.windows.advancing;
      if (choices.windows.receding !== undefined) windows.receding = choices.windows.receding;
      if (Object.keys(windows).length > 0) {
        options.windows = windows;
        save.windows = windows;
      }
    }
    return { ok: true, result: summariseMeasurement(series, kind, options), tiltsDeg, save };
  } catch (error) {
    return {
      ok: false,
      message: error instanceof Error ? error.message : 'The series could not be summarised.',
    };
  }
}
