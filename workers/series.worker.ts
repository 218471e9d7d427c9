/// <reference lib="webworker" />
/**
 * Series worker: loads OpenCV once and analyses the frames of a series in the order they arrive,
 * with one lib/dynamic tracker per series (a region around the last outline, the last baseline
 * kept while it fits). Every frame is answered, a failed one with its warning and null values.
 */
import './opencv-wasm-location';
import { loadOpenCv, type OpenCv } from '@/lib/analysis/opencv';
import { SeriesTracker } from '@/lib/dynamic/track';
import {
  frameResult,
  type SeriesWorkerRequest,
  type SeriesWorkerResponse,
} from '@/lib/dynamic/worker-protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const opencv = loadOpenCv();
let current: { seriesId: number; tracker: SeriesTracker | null; cv: OpenCv | null } | null = null;
let queue: Promise<void> = Promise.resolve();

function post(message: SeriesWorkerResponse): void {
  scope.postMessage(message);
}

opencv.then(
  () => post({ type: 'ready' }),
  (error: unknown) =>
    post({
      type: 'error',
      seriesId: -1,
      index: null,
      message: `The analysis engine could not load (${error instanceof Error ? error.message : String(error)}); reload the page.`,
    }),
);

async function handle(request: SeriesWorkerRequest): Promise<void> {
  if (request.type === 'start') {
    const { cv } = await opencv;
    current = { seriesId: request.seriesId, tracker: new SeriesTracker(cv, request.options), cv };
    return;
  }
  if (request.type === 'stop') {
    if (current?.seriesId === request.seriesId) current = null;
    return;
  }
  if (!current || current.seriesId !== request.seriesId || !current.tracker) return;
  try {
    const frame = current.tracker.analyse(request.image, request.index, request.tSec);
    post({ type: 'frame', seriesId: request.seriesId, frame: frameResult(frame) });
  } catch (error) {
    post({
      type: 'error',
      seriesId: request.seriesId,
      index: request.index,
      message: error instanceof Error ? error.message : String(error),
    });
  }
}

scope.onmessage = (event: MessageEvent<SeriesWorkerRequest>) => {
  const request = event.data;
  queue = queue.then(() => handle(request)).catch(() => undefined);
};
