/**
 * Node-only: a stored series analysed from its source — a video file (decoded by ffmpeg) or frame
 * images in order with a frame rate — into the measurement of its kind. The server runs this in its
 * server's compute pool (lib/compute/node/tasks.ts, kind `reanalyse-series`) before it saves a dynamic
 * measurement.
 */
import { loadOpenCv, type FitMethod } from '../../analysis';
import { decodeImageBytes } from '../../analysis/node/decode';
import { analyseSeries } from '../series';
import { keptFrames, summariseMeasurement } from '../measurement';
import type {
  DynamicKind,
  KeptSeriesFrame,
  MeasurementOptions,
  MeasurementResult,
} from '../measurement';
import { tiltsFromRate } from '../tilt';
import type { SeriesInputFrame } from '../types';
import { decodeVideoFrames, probeVideo } from './ffmpeg';

export type ReanalyseSource =
  | { type: 'video'; path: string; fps?: number }
  | { type: 'frames'; images: Uint8Array[]; fps: number };

export interface ReanalyseRequest {
  source: ReanalyseSource;
  kind: DynamicKind;
  method: FitMethod;
  windows?: MeasurementOptions['windows'];
  tilt?: { rateDegPerSec: number; startDeg?: number } | { tiltsDeg: number[] };
  downhillSide?: MeasurementOptions['downhillSide'];
  overTime?: MeasurementOptions['overTime'];
}

export interface ReanalyseReply {
  fps: number;
  result: MeasurementResult;
  series: KeptSeriesFrame[];
}

export class SeriesSourceError extends Error {
  constructor(
    readonly code: 'no_frames' | 'tilt_mismatch' | 'missing_fps',
    message: string,
  ) {
    super(message);
    this.name = 'SeriesSourceError';
  }
}

async function* imageFrames(images: Uint8Array[], fps: number): AsyncGenerator<SeriesInputFrame> {
  for (let i = 0; i < images.length; i++) {
    yield { image: await decodeImageBytes(images[i]), tSec: i / fps };
  }
}

/** Decodes and analyses the whole series, then summarises it for its kind. */
export async function reanalyseSeries(request: ReanalyseRequest): Promise<ReanalyseReply> {
  const { source } = request;
  let frames: AsyncIterable<SeriesInputFrame>;
  let fps: number;
  if (source.type === 'video') {
    const info = await probeVideo(source.path);
    const rate = source.fps ?? info.fps;
    if (!rate)
      throw new SeriesSourceError(
        'missing_fps',
        'The video does not state its frame rate; give the frame rate and save again.',
      );
    fps = rate;
    frames = decodeVideoFrames(source.path, { fps, info });
  } else {
    fps = source.fps;
    frames = imageFrames(source.images, fps);
  }
  const { cv } = await loadOpenCv();
  const analysed = await analyseSeries(cv, frames, { method: request.method });
  if (!analysed.length) throw new SeriesSourceError('no_frames', 'The source holds no frame.');
  let tiltsDeg: number[] | undefined;
  if (request.tilt) {
    tiltsDeg =
      'tiltsDeg' in request.tilt
        ? request.tilt.tiltsDeg
        : tiltsFromRate(
            analysed.map((f) => f.tSec),
            request.tilt.rateDegPerSec,
            request.tilt.startDeg ?? 0,
          );
    if (tiltsDeg.length !== analysed.length)
      throw new SeriesSourceError(
        'tilt_mismatch',
        `The tilt column has ${tiltsDeg.length} values but the series has ${analysed.length} frames; give one tilt per frame.`,
      );
  }
  const result = summariseMeasurement(analysed, request.kind, {
    ...(request.windows ? { windows: request.windows } : {}),
    ...(tiltsDeg ? { tiltsDeg } : {}),
    ...(request.downhillSide ? { downhillSide: request.downhillSide } : {}),
    ...(request.overTime ? { overTime: request.overTime } : {}),
  });
  return { fps, result, series: keptFrames(analysed, tiltsDeg) };
}
