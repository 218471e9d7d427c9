/// <reference lib="webworker" />
/**
 * Drop-analysis worker: loads OpenCV once, fetches each photo's canonical gray pixels from the
 * server (the same decoding the server analyses), detects its edges once and keeps them
 * (lib/analysis/detection-cache.ts), and answers `analyse` requests (lib/analysis/worker-protocol)
 * by fitting only. A newer request for the same drop supersedes a pending older one.
 */
import './opencv-wasm-location';
import { measureDrop } from '@/lib/analysis/analyse';
import { DetectionCache } from '@/lib/analysis/detection-cache';
import { readGzipGrayPixels } from '@/lib/analysis/gray-pixels';
import { loadOpenCv } from '@/lib/analysis/opencv';
import { AnalysisError } from '@/lib/analysis/types';
import { LatestPerDropQueue } from '@/lib/analysis/request-queue';
import {
  packResult,
  transferablesOf,
  type AnalyseRequest,
  type AnalyseResponse,
  type WorkerRequest,
} from '@/lib/analysis/worker-protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const opencv = loadOpenCv();
const pending = new LatestPerDropQueue<AnalyseRequest>();
const cache = new DetectionCache(async (url) => {
  const response = await fetch(url, { credentials: 'same-origin' });
  if (!response.ok) {
    throw new AnalysisError(
      'bad_input',
      response.status === 404
        ? 'This photo is no longer available; remove it from the strip.'
        : `The photo's pixels could not be loaded (HTTP ${response.status}); reload the page.`,
    );
  }
  if (!response.body) throw new AnalysisError('bad_input', 'The photo’s pixels arrived empty; reload the page.');
  return readGzipGrayPixels(response.body);
});
let draining = false;

function post(message: AnalyseResponse): void {
  scope.postMessage(message, transferablesOf(message));
}

opencv.then(
  () => post({ type: 'ready' }),
  () => undefined,
);

scope.onmessage = (event: MessageEvent<WorkerRequest>) => {
  const request = event.data;
  if (request?.type === 'forget') {
    cache.forget(request.dropId);
    return;
  }
  if (request?.type !== 'analyse') return;
  const superseded = pending.enqueue(request);
  if (superseded) {
    post({ type: 'superseded', requestId: superseded.requestId, dropId: superseded.dropId });
  }
  if (!draining) void drain();
};

async function drain(): Promise<void> {
  draining = true;
  try {
    const { cv } = await opencv;
    for (let request = pending.next(); request; request = pending.next()) {
      const { dropId, requestId, quality } = request;
      try {
        const { detection, pixelsMs, detectMs } = await cache.detection(
          cv,
          dropId,
          request.pixelsUrl,
          request.options,
        );
        const started = performance.now();
        const result = measureDrop(detection, { ...request.options, draft: quality === 'draft' });
        const measureMs = performance.now() - started;
        result.timeMs = measureMs + (detectMs ?? 0);
        post({
          type: 'result',
          requestId,
          dropId,
          quality,
          packed: packResult(result),
          timing: { pixelsMs, detectMs, measureMs },
        });
      } catch (error) {
        const code = error instanceof AnalysisError ? error.code : 'internal_error';
        const message = error instanceof Error ? error.message : String(error);
        post({ type: 'error', requestId, dropId, quality, error: { code, message } });
      }
    }
  } finally {
    draining = false;
  }
}
