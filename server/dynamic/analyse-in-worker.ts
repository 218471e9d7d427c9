import 'server-only';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { AppError } from '@/lib/app-error';
import type { ReanalyseReply, ReanalyseRequest } from '@/lib/dynamic/node/reanalyse';

/**
 * Runs a series re-analysis in a worker thread (node:worker_threads), one at a time, so the web
 * server's event loop keeps answering while a video of hundreds of frames is analysed (seconds
 * to minutes of CPU). The worker is lib/dynamic/node/reanalyse-worker.ts, loaded from the source
 * tree through tsx's require hook (tsx is installed with the app), so no separate build is needed;
 * it decodes with ffmpeg and analyses with lib/dynamic, and ends after its one request.
 */

const WORKER_ENTRY = path.join(process.cwd(), 'lib/dynamic/node/reanalyse-worker.ts');
const BOOTSTRAP = `
const { workerData } = require('node:worker_threads');
require('tsx/cjs/api').require(workerData.entry, workerData.entry);
`;

type WorkerMessage =
  | { ok: true; reply: ReanalyseReply }
  | { ok: false; error: { name: string; code: string | null; message: string } };

let queue: Promise<unknown> = Promise.resolve();

/** The worker's failure as the API's error: the source's problem, or an internal one. */
function toAppError(error: { name: string; code: string | null; message: string }): Error {
  if (error.name === 'VideoError' && error.code === 'unreadable_video')
    return new AppError(
      'unreadable_video',
      `${error.message} Upload the video again or export it as MP4, WebM or AVI (MJPEG).`,
    );
  if (error.name === 'DecodeError')
    return new AppError(
      'unreadable_photo',
      `A frame could not be decoded: ${error.message} Upload the frames as PNG, JPEG, TIFF or BMP.`,
    );
  if (error.name === 'SeriesSourceError' || error.name === 'RangeError')
    return new AppError('bad_input', error.message);
  return new Error(`Series re-analysis failed (${error.name}): ${error.message}`);
}

function runOnce(request: ReanalyseRequest): Promise<ReanalyseReply> {
  return new Promise((resolve, reject) => {
    const transfer =
      request.source.type === 'frames'
        ? request.source.images.map((b) => b.buffer as ArrayBuffer)
        : [];
    const worker = new Worker(BOOTSTRAP, {
      eval: true,
      workerData: { entry: WORKER_ENTRY, ...request },
      transferList: transfer,
    });
    let settled = false;
    worker.once('message', (message: WorkerMessage) => {
      settled = true;
      if (message.ok) resolve(message.reply);
      else reject(toAppError(message.error));
      void worker.terminate();
    });
    worker.once('error', (error) => {
      if (!settled) reject(error);
      settled = true;
    });
    worker.once('exit', (code) => {
      if (!settled)
        reject(new Error(`The series worker stopped with exit code ${code} before it answered.`));
      settled = true;
    });
  });
}

/** Queues the request behind any running one and answers its result. */
export function analyseInWorker(request: ReanalyseRequest): Promise<ReanalyseReply> {
  const run = queue.then(() => runOnce(request));
  queue = run.catch(() => undefined);
  return run;
}
