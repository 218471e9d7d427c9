'use client';

import { generateReactHelpers } from '@uploadthing/react';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { DropPhotoRouter } from '@/app/api/uploadthing/route';
import type { DropPhotoUploadResult } from '@/lib/uploads/file-router';

/** The SDK's upload hook, typed with the app's file router (also used by the tensiometry page). */
export const { useUploadThing } = generateReactHelpers<DropPhotoRouter>();

const ACCEPTED = ['image/png', 'image/jpeg', 'image/tiff', 'image/bmp', 'image/x-ms-bmp'];
const ACCEPTED_EXTENSIONS = /\.(png|jpe?g|tiff?|bmp)$/i;
const MAX_BYTES = 25 * 1024 * 1024;
const MAX_FILES = 50;

/** What the 'dropPhoto' route would refuse before any byte is sent, in words; null when fine. */
export function photoFileProblem(file: File): string | null {
  if (!ACCEPTED.includes(file.type) && !ACCEPTED_EXTENSIONS.test(file.name))
    return `${file.name} is not a PNG, JPEG, TIFF or BMP photo. Export the drop photo in one of these formats.`;
  if (file.size > MAX_BYTES)
    return `${file.name} is larger than 25 MB. Export it at a lower resolution or as PNG.`;
  return null;
}

export type UploadedPhoto = { id: string; name: string; width: number; height: number };

type Row = { key: string; file: File; problem: string | null };

/** Beadline's own drop zone; each file uploads through the SDK hook with its own progress. */
export function PhotoDropZone({ onUploaded }: { onUploaded(photo: UploadedPhoto): void }) {
  const [rows, setRows] = useState<Row[]>([]);
  const [dragging, setDragging] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const inputRef = useRef<HTMLInputElement>(null);

  const addFiles = useCallback((files: File[]) => {
    if (files.length === 0) return;
    const taken = files.slice(0, MAX_FILES);
    setNotice(
      files.length > MAX_FILES
        ? `Only ${MAX_FILES} photos can be uploaded at once; the first ${MAX_FILES} were taken. Add the rest afterwards.`
        : null,
    );
    setRows((current) => [
      ...current,
      ...taken.map((file) => ({
        key: `${file.name}-${file.size}-${file.lastModified}-${Math.random().toString(36).slice(2)}`,
        file,
        problem: photoFileProblem(file),
      })),
    ]);
  }, []);

  return (
    <section aria-label="Upload drop photos" className="mb-4">
      <div
        onDragOver={(event) => {
          event.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={(event) => {
          event.preventDefault();
          setDragging(false);
          addFiles([...event.dataTransfer.files]);
        }}
        className={`flex flex-col items-center justify-center gap-2 rounded-lg border-2 border-dashed px-4 py-6 text-center text-sm ${
          dragging ? 'border-lagoon-500 bg-lagoon-50' : 'border-ink-300 bg-white'
        }`}
      >
        <p className="font-medium text-ink-900">Drop droplet photos here</p>
        <p className="text-ink-600">PNG, JPEG, TIFF or BMP, up to 25 MB each and 50 at a time.</p>
        <button type="button" className="btn-quiet" onClick={() => inputRef.current?.click()}>
          Choose photos…
        </button>
        <label htmlFor="photo-files" className="sr-only">
          Drop photos
        </label>
        <input
          id="photo-files"
          ref={inputRef}
          type="file"
          multiple
          accept=".png,.jpg,.jpeg,.tif,.tiff,.bmp,image/png,image/jpeg,image/tiff,image/bmp"
          className="sr-only"
          data-testid="photo-input"
          onChange={(event) => {
            addFiles([...(event.target.files ?? [])]);
            event.target.value = '';
          }}
        />
      </div>
      {notice ? <p className="mt-2 text-sm text-amber-700">{notice}</p> : null}
      {rows.length > 0 ? (
        <ul className="mt-3 space-y-1" aria-label="Uploads">
          {rows.map((row) => (
            <UploadRow
              key={row.key}
              row={row}
              onUploaded={onUploaded}
              onDismiss={() => setRows((current) => current.filter((r) => r.key !== row.key))}
            />
          ))}
        </ul>
      ) : null}
    </section>
  );
}

function UploadRow({
  row,
  onUploaded,
  onDismiss,
}: {
  row: Row;
  onUploaded(photo: UploadedPhoto): void;
  onDismiss(): void;
}) {
  const [progress, setProgress] = useState(0);
  const [state, setState] = useState<{ kind: 'uploading' | 'done' | 'refused'; message?: string }>(
    row.problem ? { kind: 'refused', message: row.problem } : { kind: 'uploading' },
  );
  const started = useRef(false);
  const { startUpload } = useUploadThing('dropPhoto', {
    onUploadProgress: setProgress,
    onUploadError: (error) => setState({ kind: 'refused', message: error.message }),
  });

  useEffect(() => {
    if (row.problem || started.current) return;
    started.current = true;
    startUpload([row.file], {})
      .then((results) => {
        const outcome = results?.[0]?.serverData as DropPhotoUploadResult | undefined;
        if (!outcome) return;
        if (outcome.status === 'stored') {
          setState({ kind: 'done' });
          onUploaded({
            id: outcome.photoId,
            name: row.file.name,
            width: outcome.width,
            height: outcome.height,
          });
        } else {
          setState({ kind: 'refused', message: outcome.message });
        }
      })
      .catch((error: unknown) =>
        setState({
          kind: 'refused',
          message: error instanceof Error ? error.message : 'The upload failed. Try again.',
        }),
      );
  }, [row, startUpload, onUploaded]);

  if (state.kind === 'done') return null;
  return (
    <li className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-md border border-ink-200 bg-white px-3 py-2 text-sm">
      <span
        className={`min-w-0 font-medium text-ink-900 ${state.kind === 'refused' ? 'basis-full break-all' : 'flex-1 truncate'}`}
      >
        {row.file.name}
      </span>
      {state.kind === 'uploading' ? (
        <>
          <progress
            max={100}
            value={progress}
            className="h-2 w-32 accent-lagoon-600"
            aria-label={`Uploading ${row.file.name}`}
          />
          <span className="w-10 text-right font-mono text-xs text-ink-600">{progress}%</span>
        </>
      ) : (
        <>
          <span role="status" className="min-w-0 flex-1 text-coral-700">
            {state.message}
          </span>
          <button type="button" className="text-xs text-ink-500 underline" onClick={onDismiss}>
            Dismiss
          </button>
        </>
      )}
    </li>
  );
}
