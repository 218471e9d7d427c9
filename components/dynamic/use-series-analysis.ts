'use client';

import { useCallback, useEffect, useRef, useState } from 'react';
import type { FitMethod } from '@/lib/analysis/types';
import type { SeriesInputFrame } from '@/lib/dynamic/types';
import {
  frameTransferables,
  type SeriesFrameResult,
  type SeriesWorkerRequest,
  type SeriesWorkerResponse,
} from '@/lib/dynamic/worker-protocol';

export type SeriesRunStatus = 'idle' | 'running' | 'done' | 'stopped' | 'failed';

export interface SeriesRun {
  status: SeriesRunStatus;
  frames: SeriesFrameResult[];
  /** Frame count when known in advance. */
  total: number | null;
  error: string | null;
  /** Wall time per frame in the browser (decoding, transfer and analysis), for the figures. */
  msPerFrame: number | null;
}

const IDLE: SeriesRun = { status: 'idle', frames: [], total: null, error: null, msPerFrame: null };
/** Frames sent ahead of the worker: enough to keep it busy, few enough to bound memory. */
const AHEAD = 3;
/**
 * Finished frames reach the plot and the progress bar at most this often: drawing the plot for
 * every frame of a 300-frame series cost the page more than the analysis itself.
 */
const SHOW_EVERY_MS = 120;

/**
 * The series worker (workers/series.worker.ts) for one page: frames go in as they are decoded, at
 * most a few ahead of the analysis; results land in `frames` a few times a second as they finish,
 * so the plot fills in and the progress bar moves. A new run or `stop` ends the previous run.
 */
export function useSeriesAnalysis() {
  const worker = useRef<Worker | null>(null);
  const seriesId = useRef(0);
  const waiting = useRef<Map<number, (frame: SeriesFrameResult | Error) => void>>(new Map());
  const [run, setRun] = useState<SeriesRun>(IDLE);

  const ensureWorker = useCallback((): Worker => {
    if (worker.current) return worker.current;
    const w = new Worker(new URL('../../workers/series.worker.ts', import.meta.url), {
      type: 'module',
    });
    w.onmessage = (event: MessageEvent<SeriesWorkerResponse>) => {
      const message = event.data;
      if (message.type === 'ready') return;
      if (message.seriesId !== seriesId.current && message.seriesId !== -1) return;
      if (message.type === 'frame') {
        waiting.current.get(message.frame.index)?.(message.frame);
        waiting.current.delete(message.frame.index);
        return;
      }
      const failure = new Error(message.message);
      if (message.index !== null) {
        waiting.current.get(message.index)?.(failure);
        waiting.current.delete(message.index);
      } else {
        for (const settle of waiting.current.values()) settle(failure);
        waiting.current.clear();
      }
    };
    w.onerror = () => {
      for (const settle of waiting.current.values())
        settle(new Error('The analysis worker stopped; reload the page and analyse again.'));
      waiting.current.clear();
    };
    worker.current = w;
    return w;
  }, []);

  useEffect(
    () => () => {
      worker.current?.terminate();
      worker.current = null;
    },
    [],
  );

  const send = (w: Worker, request: SeriesWorkerRequest) =>
    w.postMessage(request, frameTransferables(request));

  /** Analyses the frames in order; resolves with every frame result when the run ends. */
  const analyse = useCallback(
    async (
      frames: AsyncIterable<SeriesInputFrame> | Iterable<SeriesInputFrame>,
      options: { method: FitMethod; total: number | null },
    ): Promise<SeriesFrameResult[]> => {
      const w = ensureWorker();
      const id = ++seriesId.current;
      waiting.current.clear();
      send(w, { type: 'start', seriesId: id, options: { method: options.method } });
      setRun({ ...IDLE, status: 'running', total: options.total });
      const done: SeriesFrameResult[] = [];
      const inFlight = new Set<Promise<void>>();
      const started = performance.now();
      let index = 0;
      // Frames finished since the last update of the page, shown together.
      let unshown: SeriesFrameResult[] = [];
      let showTimer: ReturnType<typeof setTimeout> | null = null;
      const showFinished = () => {
        if (showTimer !== null) clearTimeout(showTimer);
        showTimer = null;
        const batch = unshown;
        unshown = [];
        if (batch.length === 0 || seriesId.current !== id) return;
        setRun((r) => ({ ...r, frames: [...r.frames, ...batch].sort((a, b) => a.index - b.index) }));
      };
      try {
        for await (const input of frames) {
          if (seriesId.current !== id) break;
          const frameIndex = index++;
          const result = new Promise<SeriesFrameResult | Error>((resolve) =>
            waiting.current.set(frameIndex, resolve),
          );
          send(w, { type: 'frame', seriesId: id, index: frameIndex, tSec: input.tSec, image: input.image });
          const settled: Promise<void> = result.then((frame) => {
            inFlight.delete(settled);
            if (frame instanceof Error) throw frame;
            done.push(frame);
            unshown.push(frame);
            showTimer ??= setTimeout(showFinished, SHOW_EVERY_MS);
          });
          inFlight.add(settled);
          while (inFlight.size >= AHEAD) await Promise.race(inFlight);
        }
        await Promise.all(inFlight);
        showFinished();
        const stopped = seriesId.current !== id;
        const elapsed = performance.now() - started;
        if (!stopped)
          setRun((r) => ({
            ...r,
            status: 'done',
            total: done.length,
            msPerFrame: done.length ? elapsed / done.length : null,
          }));
        return done.sort((a, b) => a.index - b.index);
      } catch (error) {
        showFinished();
        send(w, { type: 'stop', seriesId: id });
        if (seriesId.current === id)
          setRun((r) => ({
            ...r,
            status: 'failed',
            error: error instanceof Error ? error.message : 'The series could not be analysed.',
          }));
        throw error;
      }
    },
    [ensureWorker],
  );

  const stop = useCallback(() => {
    const id = seriesId.current;
    if (worker.current) send(worker.current, { type: 'stop', seriesId: id });
    seriesId.current++;
    for (const settle of waiting.current.values()) settle(new Error('Stopped.'));
    waiting.current.clear();
    setRun((r) => (r.status === 'running' ? { ...r, status: 'stopped' } : r));
  }, []);

  /** Shows frames analysed elsewhere (the server's series of a video the browser cannot decode). */
  const show = useCallback((frames: SeriesFrameResult[]) => {
    seriesId.current++;
    setRun({ ...IDLE, status: 'done', frames, total: frames.length });
  }, []);

  return { run, analyse, stop, show };
}
