'use client';

import { useEffect, useMemo, useSyncExternalStore } from 'react';
import type { AnalyseOptions, AnalysisResult, Baseline } from '@/lib/analysis/types';
import {
  unpackResult,
  type AnalyseQuality,
  type AnalyseRequest,
  type AnalyseResponse,
  type WorkerRequest,
} from '@/lib/analysis/worker-protocol';

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

/** After this long without a newer request for a photo, its draft is followed by the full result. */
const REST_MS = 120;

type Waiter = {
  options: AnalyseOptions;
  key: string;
  resolve(result: AnalysisResult): void;
  reject(error: Error): void;
  onProvisional?: (result: AnalysisResult) => void;
  createdAt: number;
  draftSent: boolean;
  fullSent: boolean;
};
type DropState = {
  /** The newest request, until its full result arrives. */
  waiter: Waiter | null;
  /** A draft asked for straight from a drag (`preview`), before the page's own request. */
  preview: { options: AnalyseOptions; key: string } | null;
  /** The request in the worker (at most one per photo, so results never arrive out of order). */
  inFlight: { requestId: number; waiter: Waiter | null; quality: AnalyseQuality } | null;
  /** The options of the page's newest request, which a preview changes only in the baseline. */
  lastOptions: AnalyseOptions | null;
  /** The options of the newest draft sent, so the page's request for them is not drafted twice. */
  lastDraftKey: string | null;
  timer: ReturnType<typeof setTimeout> | null;
};

/** Where the worker fetches a photo's canonical gray pixels (the server's decoding). */
export const pixelsUrlOf = (photoId: string) => `/api/photos/${photoId}/pixels`;

/**
 * The analysis worker's client, one per page. The worker fetches each photo's pixels and detects its
 * edges once; here each photo has at most one request in the worker and only the newest next one
 * waits. While something shows a photo live (`useLiveResult`, the canvas), a request first gets a
 * quick draft, published to it at once so it follows a baseline drag, and, once no newer request
 * has come for REST_MS, the full result, which is published too and resolves the promise. A drag
 * can ask for a draft itself (`preview`) before the page has taken the new baseline.
 */
class AnalysisClient {
  private readonly worker: Worker;
  private readonly drops = new Map<string, DropState>();
  private readonly live = new Map<string, AnalysisResult | null>();
  private readonly listeners = new Map<string, Set<() => void>>();
  private nextId = 1;

  constructor() {
    this.worker = new Worker(new URL('../../workers/analysis.worker.ts', import.meta.url), {
      type: 'module',
    });
    this.worker.onmessage = (event: MessageEvent<AnalyseResponse>) => this.receive(event.data);
  }

  dispose() {
    this.worker.terminate();
    for (const state of this.drops.values()) {
      if (state.timer) clearTimeout(state.timer);
      state.waiter?.reject(new Superseded());
    }
    this.drops.clear();
  }

  analyse(
    dropId: string,
    options: AnalyseOptions,
    onProvisional?: (result: AnalysisResult) => void,
  ): Promise<AnalysisResult> {
    const state = this.stateOf(dropId);
    state.lastOptions = options;
    return new Promise<AnalysisResult>((resolve, reject) => {
      state.waiter?.reject(new Superseded());
      const key = JSON.stringify(options);
      state.waiter = {
        options,
        key,
        resolve,
        reject,
        onProvisional,
        createdAt: performance.now(),
        // A draft for exactly these options is already on its way (a preview of this drag step).
        draftSent: state.lastDraftKey === key,
        fullSent: false,
      };
      this.pump(dropId);
    });
  }

  /** A draft for the page's newest options with this baseline, straight from a drag. */
  preview(dropId: string, baseline: Baseline) {
    const state = this.drops.get(dropId);
    if (!state?.lastOptions || !this.listeners.has(dropId)) return;
    const options = { ...state.lastOptions, baseline };
    state.preview = { options, key: JSON.stringify(options) };
    this.pump(dropId);
  }

  /** Follows the newest result (draft or full) of a photo; returns the unsubscribe function. */
  subscribe(dropId: string, listener: () => void): () => void {
    let set = this.listeners.get(dropId);
    if (!set) {
      set = new Set();
      this.listeners.set(dropId, set);
    }
    set.add(listener);
    return () => {
      set.delete(listener);
      if (!set.size) this.listeners.delete(dropId);
    };
  }

  liveResult(dropId: string): AnalysisResult | null {
    return this.live.get(dropId) ?? null;
  }

  private publish(dropId: string, result: AnalysisResult | null) {
    this.live.set(dropId, result);
    for (const listener of this.listeners.get(dropId) ?? []) listener();
  }

  forget(dropId: string) {
    const state = this.drops.get(dropId);
    if (state?.timer) clearTimeout(state.timer);
    state?.waiter?.reject(new Superseded());
    this.drops.delete(dropId);
    this.live.delete(dropId);
    const message: WorkerRequest = { type: 'forget', dropId };
    this.worker.postMessage(message);
  }

  private stateOf(dropId: string): DropState {
    let state = this.drops.get(dropId);
    if (!state) {
      state = {
        waiter: null,
        preview: null,
        inFlight: null,
        lastOptions: null,
        lastDraftKey: null,
        timer: null,
      };
      this.drops.set(dropId, state);
    }
    return state;
  }

  private pump(dropId: string) {
    const state = this.stateOf(dropId);
    if (state.timer) {
      clearTimeout(state.timer);
      state.timer = null;
    }
    if (state.inFlight) return;
    const waiter = state.waiter;
    const preview = state.preview;
    // A preview newer than the page's request goes first (for the same options, the page's own
    // request stands for it).
    if (preview) {
      state.preview = null;
      if (!waiter || waiter.key !== preview.key) {
        this.send(dropId, null, preview.options, preview.key, 'draft');
        return;
      }
    }
    if (!waiter) return;
    const drafts = Boolean(waiter.onProvisional) || this.listeners.has(dropId);
    if (drafts && !waiter.draftSent) {
      waiter.draftSent = true;
      this.send(dropId, waiter, waiter.options, waiter.key, 'draft');
      return;
    }
    if (waiter.fullSent) return;
    const waited = performance.now() - waiter.createdAt;
    if (!drafts || waited >= REST_MS) {
      waiter.fullSent = true;
      this.send(dropId, waiter, waiter.options, waiter.key, 'full');
    } else {
      state.timer = setTimeout(() => this.pump(dropId), REST_MS - waited);
    }
  }

  private send(
    dropId: string,
    waiter: Waiter | null,
    options: AnalyseOptions,
    key: string,
    quality: AnalyseQuality,
  ) {
    const state = this.stateOf(dropId);
    const requestId = this.nextId++;
    state.inFlight = { requestId, waiter, quality };
    if (quality === 'draft') state.lastDraftKey = key;
    const request: AnalyseRequest = {
      type: 'analyse',
      requestId,
      dropId,
      pixelsUrl: pixelsUrlOf(dropId),
      options,
      quality,
    };
    this.worker.postMessage(request);
  }

  private receive(message: AnalyseResponse) {
    if (message.type === 'ready') return;
    const state = this.drops.get(message.dropId);
    if (!state?.inFlight || state.inFlight.requestId !== message.requestId) return;
    const { waiter, quality } = state.inFlight;
    state.inFlight = null;
    const result = message.type === 'result' ? unpackResult(message.packed) : null;
    if (result) this.publish(message.dropId, result);
    if (waiter && waiter === state.waiter) {
      if (result) {
        if (quality === 'draft') waiter.onProvisional?.(result);
        else {
          state.waiter = null;
          waiter.resolve(result);
        }
      } else if (message.type === 'error') {
        this.publish(message.dropId, null);
        state.waiter = null;
        waiter.reject(new AnalysisFailed(message.error.code, message.error.message));
      } else if (quality === 'draft') waiter.draftSent = false;
      else waiter.fullSent = false;
    } else if (message.type === 'error' && !state.waiter) {
      // A preview that cannot be analysed: show nothing rather than an older angle.
      this.publish(message.dropId, null);
    }
    this.pump(message.dropId);
  }
}

// One client per page, shared by the workspace and the canvas; started with the first user and
// stopped when the last goes away.
let shared: AnalysisClient | null = null;
let users = 0;

function acquire(): AnalysisClient {
  shared ??= new AnalysisClient();
  users++;
  return shared;
}

function release() {
  users--;
  if (users === 0 && shared) {
    shared.dispose();
    shared = null;
  }
}

/** Keeps the shared client alive while the calling component is mounted; returns it once started. */
function useSharedClient(): AnalysisClient | null {
  useEffect(() => {
    acquire();
    notifyClient();
    return () => {
      release();
      notifyClient();
    };
  }, []);
  return useSyncExternalStore(
    subscribeToClient,
    () => shared,
    () => null,
  );
}

const clientListeners = new Set<() => void>();
function subscribeToClient(listener: () => void) {
  clientListeners.add(listener);
  return () => {
    clientListeners.delete(listener);
  };
}
function notifyClient() {
  for (const listener of clientListeners) listener();
}

/** The analysis worker, started once per page and stopped when the page goes away. */
export function useAnalysisWorker() {
  useSharedClient();
  // The client is read when called (it starts in an effect, after the first render).
  return useMemo(
    () => ({
      /**
       * The full analysis of a photo with these options; drafts go to `onProvisional` (and to
       * `useLiveResult`) first. Rejects with Superseded when a newer request replaces it.
       */
      analyse(
        dropId: string,
        options: AnalyseOptions,
        onProvisional?: (result: AnalysisResult) => void,
      ): Promise<AnalysisResult> {
        return shared?.analyse(dropId, options, onProvisional) ?? Promise.reject(new Superseded());
      },
      forget(dropId: string) {
        shared?.forget(dropId);
      },
    }),
    [],
  );
}

/** Asks for a draft of a photo with this baseline at once, during a drag (see `preview`). */
export function previewBaseline(dropId: string | undefined, baseline: Baseline) {
  if (dropId) shared?.preview(dropId, baseline);
}

/**
 * The newest result of a photo as it arrives from the worker, drafts included (null before the
 * first, after an error, or without a photo): what the canvas shows while a baseline is dragged,
 * without waiting for the page's own state.
 */
export function useLiveResult(dropId: string | null | undefined): AnalysisResult | null {
  const client = useSharedClient();
  return useSyncExternalStore(
    (listener) => (client && dropId ? client.subscribe(dropId, listener) : () => undefined),
    () => (client && dropId ? client.liveResult(dropId) : null),
    () => null,
  );
}
