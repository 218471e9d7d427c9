/**
 * Worker-thread entry (node:worker_threads): one ReanalyseRequest in `workerData`, one message
 * out — `{ ok: true, reply }` or `{ ok: false, error: { name, code, message } }` — then it ends.
 * Started by server/dynamic/analyse-in-worker.ts so a long series never blocks the web server's
 * event loop.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { reanalyseSeries, type ReanalyseRequest } from './reanalyse';

reanalyseSeries(workerData as ReanalyseRequest).then(
  (reply) => parentPort?.postMessage({ ok: true, reply }),
  (error: unknown) => {
    const e = error as { name?: string; code?: unknown; message?: string };
    parentPort?.postMessage({
      ok: false,
      error: {
        name: e?.name ?? 'Error',
        code: typeof e?.code === 'string' ? e.code : null,
        message: e?.message ?? String(error),
      },
    });
  },
);
