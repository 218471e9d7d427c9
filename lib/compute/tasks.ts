/**
 * The CPU-heavy computations the server runs off its request thread (server/compute/pool.ts hands
 * them to workers/compute.worker.ts): a message in, a message out, both plain data that survives
 * the structured clone between threads unchanged (numbers are copied bit for bit). An input the
 * computation cannot use comes back as `{ ok: false, error }` with the core's own error kind and
 * code, so the caller can throw the same error the core would have thrown in its own thread.
 */
import { analyseDrop } from '../analysis/analyse';
import {
  AnalysisError,
  type AnalyseOptions,
  type AnalysisResult,
  type GrayImage,
} from '../analysis/types';
import { TensiometryInputError } from '../tensiometry/errors';
import {
  fitPendantDrop,
  fittedPendantOutline,
  pendantEdgeFromImage,
  type EdgePoint,
  type PendantDropInput,
  type PendantDropResult,
  type PendantEdgeExtraction,
} from '../tensiometry/pendant-drop';

export type ComputeTask =
  /** A pendant-drop fit of a traced outline. */
  | { kind: 'pendant-fit'; input: PendantDropInput }
  /** A pendant drop from a photo's pixels: the outline and needle found, fitted, drawn. */
  | {
      kind: 'pendant-photo';
      image: GrayImage;
      needleOuterDiameterMm: number;
      densityDifferenceKgPerM3: number;
    }
  /** A sessile drop photo analysed by lib/analysis (the server's re-analysis on save). */
  | { kind: 'analyse-drop'; image: GrayImage; options: AnalyseOptions };

export type PendantPhotoFit = {
  extraction: PendantEdgeExtraction;
  result: PendantDropResult;
  profile: EdgePoint[];
};

export type ComputeValue<T extends ComputeTask> = T extends { kind: 'pendant-fit' }
  ? PendantDropResult
  : T extends { kind: 'pendant-photo' }
    ? PendantPhotoFit
    : AnalysisResult;

export type ComputeFailure = { kind: 'tensiometry' | 'analysis'; code: string; message: string };

export type ComputeReply<T extends ComputeTask = ComputeTask> =
  { ok: true; value: ComputeValue<T> } | { ok: false; error: ComputeFailure };

async function compute(task: ComputeTask): Promise<ComputeValue<ComputeTask>> {
  switch (task.kind) {
    case 'pendant-fit':
      return fitPendantDrop(task.input);
    case 'pendant-photo': {
      const extraction = pendantEdgeFromImage(task.image);
      const result = fitPendantDrop({
        edge: extraction.edge,
        needleOuterDiameterMm: task.needleOuterDiameterMm,
        needleOuterDiameterPx: extraction.needleOuterDiameterPx,
        densityDifferenceKgPerM3: task.densityDifferenceKgPerM3,
      });
      return { extraction, result, profile: fittedPendantOutline(result, extraction.needleTipY) };
    }
    case 'analyse-drop':
      return analyseDrop(task.image, task.options);
  }
}

/** Runs one task; the core's input errors become a failure reply, anything else is thrown. */
export async function runComputeTask<T extends ComputeTask>(task: T): Promise<ComputeReply<T>> {
  try {
    return { ok: true, value: (await compute(task)) as ComputeValue<T> };
  } catch (error) {
    if (error instanceof TensiometryInputError) {
      return {
        ok: false,
        error: { kind: 'tensiometry', code: error.code, message: error.message },
      };
    }
    if (error instanceof AnalysisError) {
      return { ok: false, error: { kind: 'analysis', code: error.code, message: error.message } };
    }
    throw error;
  }
}

/** The error the core threw in the worker, rebuilt in the caller's thread. */
export function computeError(failure: ComputeFailure): TensiometryInputError | AnalysisError {
  return failure.kind === 'tensiometry'
    ? new TensiometryInputError(failure.code, failure.message)
    : new AnalysisError(failure.code as AnalysisError['code'], failure.message);
}
