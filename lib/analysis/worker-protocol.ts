/**
 * Messages between the page and workers/analysis.worker.ts. Pixel buffers travel as transferables:
 * the page gives its buffer up with the request and receives it back with the reply.
 */
import type { AnalyseOptions, AnalysisResult } from './types';

export interface AnalyseRequest {
  type: 'analyse';
  /** Increasing per page; a newer request for the same drop supersedes older pending ones. */
  requestId: number;
  dropId: string;
  width: number;
  height: number;
  bitDepth: 8 | 16;
  /** Gray samples, row-major (Uint8Array or Uint16Array buffer); transferred, not copied. */
  pixels: ArrayBuffer;
  options: AnalyseOptions;
}

export type AnalyseResponse =
  | {
      type: 'result';
      requestId: number;
      dropId: string;
      result: AnalysisResult;
      pixels: ArrayBuffer;
    }
  | {
      type: 'error';
      requestId: number;
      dropId: string;
      error: { code: string; message: string };
      pixels: ArrayBuffer;
    }
  | { type: 'superseded'; requestId: number; dropId: string; pixels: ArrayBuffer }
  | { type: 'ready' };

/** The transfer list to pass to `postMessage` with a request. */
export function transferablesOf(message: AnalyseRequest | AnalyseResponse): Transferable[] {
  return 'pixels' in message ? [message.pixels] : [];
}
