/// <reference lib="webworker" />
/**
 * Drop-analysis worker: loads OpenCV once, answers `analyse` requests (lib/analysis/worker-protocol),
 * lets a newer request for the same drop supersede a pending older one, and hands pixel buffers
 * back as transferables.
 */
import './opencv-wasm-location';
import { analyseDropWith } from '@/lib/analysis/analyse';
import { loadOpenCv } from '@/lib/analysis/opencv';
import { AnalysisError } from '@/lib/analysis/types';
import { LatestPerDropQueue } from '@/lib/analysis/request-queue';
import {
  transferablesOf,
  type AnalyseRequest,
  type AnalyseResponse,
} from '@/lib/analysis/worker-protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const opencv = loadOpenCv();
const pending = new LatestPerDropQueue<AnalyseRequest>();
let scheduled = false;

function post(message: AnalyseResponse): void {
  scope.postMessage(message, transferablesOf(message));
}

opencv.then(
  () => post({ type: 'ready' }),
  () => undefined,
);

scope.onmessage = (event: MessageEvent<AnalyseRequest>) => {
  const request = event.data;
  if (request?.type !== 'analyse') return;
  const superseded = pending.enqueue(request);
  if (superseded) {
    post({
      type: 'superseded',
      requestId: superseded.requestId,
      dropId: superseded.dropId,
      pixels: superseded.pixels,
    });
  }
  if (!scheduled) {
    scheduled = true;
    // Run after the queued messages have been read, so superseded requests are never computed.
    setTimeout(() => void drain(), 0);
  }
};

async function drain(): Promise<void> {
  const { cv } = await opencv;
  scheduled = false;
  for (let request = pending.next(); request; request = pending.next()) {
    const { dropId } = request;
    const data =
      request.bitDepth === 16 ? new Uint16Array(request.pixels) : new Uint8Array(request.pixels);
    try {
      const result = analyseDropWith(
        cv,
        { width: request.width, height: request.height, data },
        request.options,
      );
      post({
        type: 'result',
        requestId: request.requestId,
        dropId,
        result,
        pixels: request.pixels,
      });
    } catch (error) {
      const code = error instanceof AnalysisError ? error.code : 'internal-error';
      const message = error instanceof Error ? error.message : String(error);
      post({
        type: 'error',
        requestId: request.requestId,
        dropId,
        error: { code, message },
        pixels: request.pixels,
      });
    }
    // Let newer messages arrive between analyses.
    await new Promise((resolve) => setTimeout(resolve, 0));
  }
}
