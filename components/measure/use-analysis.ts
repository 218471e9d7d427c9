'use client';

import { useEffect, useMemo, useRef } from 'react';
import type { AnalyseOptions, AnalysisResult } from '@/lib/analysis/types';
import { transferablesOf, type AnalyseRequest, type AnalyseResponse } from '@/lib/analysis/worker-protocol';

export class AnalysisFailed extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
  }
}

/** Rejection of a request that a newer one for the same photo replaced; callers ignore it. */
export class Superseded extends Error {}

type Pixels = { width: number; height: number; buffer: ArrayBuffer };
type Waiter = { options: AnalyseOptions; resolve(result: AnalysisResult): void; reject(error: Error): void };
type DropState = {
  size: { width: number; height: number } | null;
  /** The pixel buffer while it is here (it is away in the worker during a request). */
  pixels: ArrayBuffer | null;
  decoding: Promise<void> | null;
  /** The request in the worker (its pixels travel with it). */
  inFlight: (Waiter & { requestId: number }) | null;
  /** The newest request waiting for the pixels to come back; older ones are superseded. */
  queued: Waiter | null;
};

/** Decodes a photo in the browser and converts it to 8-bit luma (Rec. 601 weights). */
async function decodePhoto(url: string): Promise<Pixels> {
  const response = await fetch(url);
  if (!response.ok) throw new AnalysisFailed('photo-unavailable', 'The photo could not be loaded. Reload the page.');
  const bitmap = await createImageBitmap(await response.blob(), { imageOrientation: 'from-image' });
  const canvas = new OffscreenCanvas(bitmap.width, bitmap.height);
  const context = canvas.getContext('2d', { willReadFrequently: true });
  if (!context) throw new AnalysisFailed('no-canvas', 'This browser cannot read image pixels.');
  context.drawImage(bitmap, 0, 0);
  const rgba = context.getImageData(0, 0, bitmap.width, bitmap.height).data;
  const gray = new Uint8Array(bitmap.width * bitmap.height);
  for (let i = 0, j = 0; i < gray.length; i++, j += 4) {
    gray[i] = Math.round(0.299 * rgba[j] + 0.587 * rgba[j + 1] + 0.114 * rgba[j + 2]);
  }
  bitmap.close();
  return { width: canvas.width, height: canvas.height, buffer: gray.buffer };
}

/**
 * The analysis worker's client. Each photo's pixels are decoded once and then travel to the
 * worker and back as a transferred buffer. At most one request per photo is in the worker; while
 * it runs, only the newest next request is kept, so results never arrive out of order and a fast
 * baseline drag never queues stale work.
 */
class AnalysisClient {
  private readonly worker: Worker;
  private readonly drops = new Map<string, DropState>();
  private nextId = 1;

  constructor() {
    this.worker = new Worker(new URL('../../workers/analysis.worker.ts', import.meta.url), { type: 'module' });
    this.worker.onmessage = (event: MessageEvent<AnalyseResponse>) => this.receive(event.data);
  }

  dispose() {
    this.worker.terminate();
    for (const state of this.drops.values()) {
      state.inFlight?.reject(new Superseded());
      state.queued?.reject(new Superseded());
    }
    this.drops.clear();
  }

  analyse(dropId: string, imageUrl: string, options: AnalyseOptions): Promise<AnalysisResult> {
    const state = this.stateOf(dropId);
    return new Promise<AnalysisResult>((resolve, reject) => {
      state.queued?.reject(new Superseded());
      state.queued = { options, resolve, reject };
      if (!state.pixels && !state.inFlight && !state.decoding) {
        state.decoding = decodePhoto(imageUrl).then(
          (pixels) => {
            state.decoding = null;
            state.pixels = pixels.buffer;
            state.size = { width: pixels.width, height: pixels.height };
            this.pump(dropId);
          },
          (error: Error) => {
            state.decoding = null;
            state.queued?.reject(error);
            state.queued = null;
          },
        );
      } else {
        this.pump(dropId);
      }
    });
  }

  private stateOf(dropId: string): DropState {
    let state = this.drops.get(dropId);
    if (!state) {
      state = { size: null, pixels: null, decoding: null, inFlight: null, queued: null };
      this.drops.set(dropId, state);
    }
    return state;
  }

  private pump(dropId: string) {
    const state = this.stateOf(dropId);
    if (state.inFlight || !state.queued || !state.pixels || !state.size) return;
    const waiter = state.queued;
    state.queued = null;
    const requestId = this.nextId++;
    state.inFlight = { ...waiter, requestId };
    const request: AnalyseRequest = {
      type: 'analyse',
      requestId,
      dropId,
      width: state.size.width,
      height: state.size.height,
      bitDepth: 8,
      pixels: state.pixels,
      options: waiter.options,
    };
    state.pixels = null;
    this.worker.postMessage(request, transferablesOf(request));
  }

  private receive(message: AnalyseResponse) {
    if (message.type === 'ready') return;
    const state = this.drops.get(message.dropId);
    if (!state?.inFlight || state.inFlight.requestId !== message.requestId) return;
    const waiter = state.inFlight;
    state.inFlight = null;
    state.pixels = message.pixels;
    if (message.type === 'result') waiter.resolve(message.result);
    else if (message.type === 'superseded') waiter.reject(new Superseded());
    else waiter.reject(new AnalysisFailed(message.error.code, message.error.message));
    this.pump(message.dropId);
  }
}

/** The analysis worker, started once per page and stopped when the page goes away. */
export function useAnalysisWorker() {
  const client = useRef<AnalysisClient | null>(null);
  useEffect(() => {
    const instance = new AnalysisClient();
    client.current = instance;
    return () => {
      instance.dispose();
      client.current = null;
    };
  }, []);
  return useMemo(
    () => ({
      analyse(dropId: string, imageUrl: string, options: AnalyseOptions): Promise<AnalysisResult> {
        return client.current?.analyse(dropId, imageUrl, options) ?? Promise.reject(new Superseded());
      },
    }),
    [],
  );
}
