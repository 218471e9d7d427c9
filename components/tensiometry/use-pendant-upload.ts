'use client';

import { useRef, useState } from 'react';
import { photoFileProblem, useUploadThing } from '@/components/measure/uploads';
import type { DropPhotoUploadResult } from '@/lib/uploads/file-router';

export type StoredPhoto = { id: string; name: string; width: number; height: number };

export type Upload =
  | { kind: 'none' }
  | { kind: 'uploading'; name: string; progress: number }
  | { kind: 'refused'; name: string; message: string }
  | { kind: 'stored'; photo: StoredPhoto };

/**
 * Uploads the photo of a hanging drop through the upload service, as the measurement workspace
 * does, marked as a pendant-drop photo. Only the latest chosen file may change the state.
 */
export function usePendantUpload() {
  const [upload, setUpload] = useState<Upload>({ kind: 'none' });
  const attempt = useRef(0);
  // The SDK reports a failed upload here and then resolves startUpload with nothing.
  const uploadError = useRef<string | null>(null);
  const { startUpload } = useUploadThing('dropPhoto', {
    onUploadProgress: (progress) =>
      setUpload((u) => (u.kind === 'uploading' ? { ...u, progress } : u)),
    onUploadError: (error) => {
      uploadError.current = error.message;
    },
  });

  async function choose(file: File | undefined) {
    if (!file) {
      setUpload({ kind: 'none' });
      return;
    }
    const current = ++attempt.current;
    const refuse = (text: string) => {
      if (attempt.current === current)
        setUpload({ kind: 'refused', name: file.name, message: text });
    };
    const problem = photoFileProblem(file);
    if (problem) return refuse(problem);
    setUpload({ kind: 'uploading', name: file.name, progress: 0 });
    uploadError.current = null;
    try {
      const results = await startUpload([file], { purpose: 'pendant-drop' });
      const outcome = results?.[0]?.serverData as DropPhotoUploadResult | undefined;
      if (!outcome)
        return refuse(uploadError.current ?? 'The upload did not finish. Choose the photo again.');
      if (outcome.status !== 'stored') return refuse(outcome.message);
      if (attempt.current !== current) return;
      setUpload({
        kind: 'stored',
        photo: {
          id: outcome.photoId,
          name: file.name,
          width: outcome.width,
          height: outcome.height,
        },
      });
    } catch (error) {
      refuse(error instanceof Error ? error.message : 'The upload failed. Try again.');
    }
  }

  return { upload, choose };
}
