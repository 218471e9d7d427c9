/**
 * The series loop: frames in (an array, a generator, or frames decoded while the loop runs), one
 * `SeriesFrame` per input frame out, in input order, with progress reported after every frame.
 * Frames are analysed one at a time and not kept, so a long video needs memory for one frame only.
 */
import type { OpenCv } from '../analysis';
import { SeriesTracker } from './track';
import type { SeriesFrame, SeriesInputFrame, SeriesOptions } from './types';

export interface SeriesProgress {
  /** Frames finished so far. */
  done: number;
  /** Frame count when known in advance (an array, or a video whose header says it). */
  total: number | null;
}

export interface AnalyseSeriesOptions extends SeriesOptions {
  /** Called after every frame, in order, e.g. to fill a plot and a progress bar. */
  onFrame?: (frame: SeriesFrame, progress: SeriesProgress) => void;
  /** Frame count for the progress when the input is a generator. */
  total?: number;
  /** Checked before every frame; when it returns true the loop stops and returns what it has. */
  cancelled?: () => boolean;
}

/** Analyses every frame of a series with one OpenCV instance and one tracker. */
export async function analyseSeries(
  cv: OpenCv,
  frames: Iterable<SeriesInputFrame> | AsyncIterable<SeriesInputFrame>,
  options: AnalyseSeriesOptions = {},
): Promise<SeriesFrame[]> {
  const tracker = new SeriesTracker(cv, options);
  const total = Array.isArray(frames) ? frames.length : (options.total ?? null);
  const out: SeriesFrame[] = [];
  for await (const input of frames) {
    if (options.cancelled?.()) break;
    const frame = tracker.analyse(input.image, out.length, input.tSec);
    out.push(frame);
    options.onFrame?.(frame, { done: out.length, total });
  }
  return out;
}

/** Frame times from a frame rate: frame i at i / fps seconds. */
export function frameTimes(count: number, fps: number, startSec = 0): number[] {
  if (!(fps > 0))
    throw new RangeError('The frame rate must be a positive number of frames per second.');
  return Array.from({ length: count }, (_, i) => startSec + i / fps);
}
