/**
 * Messages between the page and the series worker (workers/series.worker.ts). The page decodes
 * frames (video element, frame images or the live camera) and sends their gray pixels one at a
 * time; the worker analyses them in order with one tracker and answers each with its frame
 * result, without the engine's full result (outline and edge points stay in the worker).
 */
import type { GrayImage } from '../analysis/types';
import type { SeriesFrame, SeriesOptions } from './types';

/** A frame result as it crosses the worker boundary: everything but the engine's full result. */
export type SeriesFrameResult = Omit<SeriesFrame, 'analysis'>;

export type SeriesWorkerRequest =
  /** Starts a series: a new tracker with these options; earlier frames are forgotten. */
  | { type: 'start'; seriesId: number; options: SeriesOptions }
  | { type: 'frame'; seriesId: number; index: number; tSec: number; image: GrayImage }
  /** Stops a series: frames of it still queued are skipped. */
  | { type: 'stop'; seriesId: number };

export type SeriesWorkerResponse =
  | { type: 'ready' }
  | { type: 'frame'; seriesId: number; frame: SeriesFrameResult }
  | { type: 'error'; seriesId: number; index: number | null; message: string };

/** The frame result without the engine's full result, which the page does not need. */
export function frameResult(frame: SeriesFrame): SeriesFrameResult {
  const { analysis: _analysis, ...rest } = frame;
  return rest;
}

/** The pixel buffer handed over (not copied) with a frame message. */
export function frameTransferables(request: SeriesWorkerRequest): Transferable[] {
  return request.type === 'frame' ? [request.image.data.buffer as ArrayBuffer] : [];
}
