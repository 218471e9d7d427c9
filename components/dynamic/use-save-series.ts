'use client';

import { useRef, useState } from 'react';
import { useMutation } from '@/components/data/use-mutation';
import { photoFileProblem, useUploadThing } from '@/components/measure/uploads';
import {
  savedDynamicSchema,
  type SaveDynamicInput,
  type SavedDynamic,
} from '@/lib/contracts/dynamic';
import type {
  DropPhotoUploadResult,
  SeriesVideoUploadResult,
} from '@/lib/uploads/file-router';

/** How many frame photos go in one upload request (the photo route's limit). */
const FRAMES_PER_UPLOAD = 50;

/** The source of a series as the page holds it until it is saved. */
export type PageSource =
  | { type: 'video'; file: File; fps: number }
  | { type: 'frames'; files: File[]; fps: number };

/** Where the page's frames come from; what is uploaded follows from it. */
export type SourceChoice = 'video' | 'frames' | 'camera';

/**
 * What the save will send to the upload service, in words: the source the page analysed when there
 * is one (whatever input is chosen now), else the chosen input. A video goes as the video file;
 * frame images as they are; camera frames as PNG photos of the captured frames.
 */
export function uploadDescription(
  analysed:
    | { type: 'video'; fileName: string }
    | { type: 'frames'; count: number }
    | { type: 'camera'; count: number }
    | null,
  chosen: SourceChoice,
): string {
  const photos = (n: number) => `${n} frame photo${n === 1 ? '' : 's'}`;
  if (analysed?.type === 'video') return `as the video file ${analysed.fileName}`;
  if (analysed?.type === 'frames') return `as ${photos(analysed.count)}, one per frame image`;
  if (analysed?.type === 'camera')
    return `as ${photos(analysed.count)} (PNG), one per captured frame`;
  if (chosen === 'video') return 'as the video file';
  if (chosen === 'frames') return 'as frame photos, one per frame image';
  return 'as frame photos (PNG), one per captured frame';
}

export type SaveStep =
  | { kind: 'idle' }
  | { kind: 'uploading'; what: string; progress: number }
  | { kind: 'analysing' }
  | { kind: 'saved'; saved: SavedDynamic }
  | { kind: 'failed'; message: string };

class SaveStepError extends Error {}

/**
 * Saves a series to a sample: the source goes to the upload service first (the video as one file,
 * or the frames as frame photos), then POST /api/dynamic-measurements names it, and the server
 * analyses it again before it keeps anything. An uploaded source is kept for the next attempt, so
 * a failed save does not upload it twice.
 */
export function useSaveSeries() {
  const [step, setStep] = useState<SaveStep>({ kind: 'idle' });
  const uploaded = useRef<{ source: PageSource; ref: SaveDynamicInput['source'] } | null>(null);
  const uploadError = useRef<string | null>(null);
  const mutation = useMutation<SavedDynamic>();
  const onUploadError = (error: Error) => {
    uploadError.current = error.message;
  };
  const videoUpload = useUploadThing('seriesVideo', {
    onUploadProgress: (progress) =>
      setStep((s) => (s.kind === 'uploading' ? { ...s, progress } : s)),
    onUploadError,
  });
  const photoUpload = useUploadThing('dropPhoto', { onUploadError });

  async function uploadSource(source: PageSource): Promise<SaveDynamicInput['source']> {
    if (uploaded.current?.source === source) return uploaded.current.ref;
    uploadError.current = null;
    let ref: SaveDynamicInput['source'];
    if (source.type === 'video') {
      setStep({ kind: 'uploading', what: source.file.name, progress: 0 });
      const results = await videoUpload.startUpload([source.file]);
      const outcome = results?.[0]?.serverData as SeriesVideoUploadResult | undefined;
      if (!outcome)
        throw new SaveStepError(uploadError.current ?? 'The video upload did not finish; save again.');
      if (outcome.status !== 'stored') throw new SaveStepError(outcome.message);
      ref = { type: 'video', videoId: outcome.videoId, fps: source.fps };
    } else {
      const problem = source.files.map(photoFileProblem).find(Boolean);
      if (problem) throw new SaveStepError(problem);
      const photoIds: string[] = [];
      for (let at = 0; at < source.files.length; at += FRAMES_PER_UPLOAD) {
        const batch = source.files.slice(at, at + FRAMES_PER_UPLOAD);
        setStep({
          kind: 'uploading',
          what: `frames ${at + 1}–${at + batch.length} of ${source.files.length}`,
          progress: Math.round((100 * at) / source.files.length),
        });
        const results = await photoUpload.startUpload(batch, { purpose: 'series-frame' });
        if (!results || results.length !== batch.length)
          throw new SaveStepError(uploadError.current ?? 'The frame upload did not finish; save again.');
        // The answers name their files; keep the frames in the series' order.
        const byName = new Map(results.map((r) => [r.name, r.serverData as DropPhotoUploadResult]));
        for (const file of batch) {
          const outcome = byName.get(file.name);
          if (!outcome) throw new SaveStepError(`${file.name} did not upload; save again.`);
          if (outcome.status !== 'stored') throw new SaveStepError(`${file.name}: ${outcome.message}`);
          photoIds.push(outcome.photoId);
        }
      }
      ref = { type: 'frames', photoIds, fps: source.fps };
    }
    uploaded.current = { source, ref };
    return ref;
  }

  async function save(
    source: PageSource,
    body: Omit<SaveDynamicInput, 'source'>,
  ): Promise<SavedDynamic | null> {
    try {
      const ref = await uploadSource(source);
      setStep({ kind: 'analysing' });
      const reply = await mutation.run('/api/dynamic-measurements', {
        method: 'POST',
        json: { ...body, source: ref },
        schema: savedDynamicSchema,
      });
      if (!reply.ok) {
        setStep({ kind: 'failed', message: reply.error.message });
        return null;
      }
      setStep({ kind: 'saved', saved: reply.data });
      return reply.data;
    } catch (error) {
      setStep({
        kind: 'failed',
        message:
          error instanceof SaveStepError
            ? error.message
            : error instanceof Error
              ? `${error.message} Nothing was saved; save again.`
              : 'The save failed; save again.',
      });
      return null;
    }
  }

  return { step, save, reset: () => setStep({ kind: 'idle' }) };
}
