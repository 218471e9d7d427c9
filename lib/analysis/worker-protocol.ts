/**
 * Messages between the page and workers/analysis.worker.ts.
 *
 * The worker fetches each photo's canonical gray pixels itself (from `pixelsUrl`, the server's
 * decoding: lib/analysis/gray-pixels.ts), detects its edges once and keeps them, so a new
 * baseline or method only re-fits. The page sends a `draft` request while the baseline is being
 * dragged (a quick provisional result) and a `full` one when it rests.
 */
import type { AnalyseOptions, AnalysisResult, Point } from './types';

export type AnalyseQuality = 'draft' | 'full';

export interface AnalyseRequest {
  type: 'analyse';
  /** Increasing per page; a newer request for the same drop supersedes older pending ones. */
  requestId: number;
  dropId: string;
  /** Where the worker fetches the photo's gray pixels (once per photo). */
  pixelsUrl: string;
  options: AnalyseOptions;
  quality: AnalyseQuality;
}

/** Frees the worker's copy of a photo's pixels and edges. */
export interface ForgetRequest {
  type: 'forget';
  dropId: string;
}

export type WorkerRequest = AnalyseRequest | ForgetRequest;

export interface AnalyseTiming {
  /** Fetching and decoding the pixels, when this request had to (ms). */
  pixelsMs: number | null;
  /** Edge detection, when this request had to (ms). */
  detectMs: number | null;
  /** The fit for this method and baseline (ms). */
  measureMs: number;
}

/**
 * A result on its way to the page: the point lists (edge points, fitted profile) travel as flat
 * coordinate arrays, which cross the thread boundary as one copy each instead of one object per
 * point (`packResult` / `unpackResult`).
 */
export interface PackedResult {
  result: Omit<AnalysisResult, 'edgePoints' | 'profile'>;
  left: Float64Array;
  right: Float64Array;
  profile: Float64Array | null;
}

export type AnalyseResponse =
  | {
      type: 'result';
      requestId: number;
      dropId: string;
      quality: AnalyseQuality;
      packed: PackedResult;
      timing: AnalyseTiming;
    }
  | {
      type: 'error';
      requestId: number;
      dropId: string;
      quality: AnalyseQuality;
      error: { code: string; message: string };
    }
  | { type: 'superseded'; requestId: number; dropId: string }
  | { type: 'ready' };

const flatten = (points: Point[]): Float64Array => {
  const out = new Float64Array(points.length * 2);
  points.forEach(([x, y], i) => {
    out[2 * i] = x;
    out[2 * i + 1] = y;
  });
  return out;
};

const unflatten = (flat: Float64Array): Point[] => {
  const out: Point[] = new Array(flat.length / 2);
  for (let i = 0; i < out.length; i++) out[i] = [flat[2 * i], flat[2 * i + 1]];
  return out;
};

export function packResult(result: AnalysisResult): PackedResult {
  const { edgePoints, profile, ...rest } = result;
  return {
    result: rest,
    left: flatten(edgePoints.left),
    right: flatten(edgePoints.right),
    profile: profile ? flatten(profile) : null,
  };
}

export function unpackResult(packed: PackedResult): AnalysisResult {
  return {
    ...packed.result,
    edgePoints: { left: unflatten(packed.left), right: unflatten(packed.right) },
    profile: packed.profile ? unflatten(packed.profile) : null,
  };
}

/** The transfer list of a response (its flat arrays move instead of being copied). */
export function transferablesOf(message: AnalyseResponse): Transferable[] {
  if (message.type !== 'result') return [];
  const { left, right, profile } = message.packed;
  return [left.buffer, right.buffer, ...(profile ? [profile.buffer] : [])];
}
