'use client';

import type { WorkspacePhoto } from './store';

/** What a photo's badge says: analysing, failed, needs a look, analysed, or saved as rN. */
export function photoBadge(photo: WorkspacePhoto): { label: string; tone: string } {
  if (photo.status === 'failed') return { label: 'No result', tone: 'bg-coral-500' };
  if (photo.status !== 'ready') return { label: 'Analysing', tone: 'bg-ink-400' };
  if (photo.savedRevision !== null && !photo.dirty)
    return { label: `Saved r${photo.savedRevision}`, tone: 'bg-leaf-500' };
  if (photo.result?.warnings.length) return { label: 'Check', tone: 'bg-amber-500' };
  return { label: 'Analysed', tone: 'bg-lagoon-600' };
}

/** The uploaded photos as thumbnails with their state, and how many are analysed. */
export function PhotoStrip({
  photos,
  selectedId,
  onSelect,
}: {
  photos: WorkspacePhoto[];
  selectedId: string | null;
  onSelect: (id: string) => void;
}) {
  const analysed = photos.filter((p) => p.status === 'ready' || p.status === 'failed').length;
  return (
    <>
      <div className="mb-2 flex items-center gap-3 text-sm text-ink-600">
        <span>
          {analysed} of {photos.length} analysed
        </span>
        <progress
          className="h-2 flex-1 accent-lagoon-600"
          max={photos.length}
          value={analysed}
          aria-label="Photos analysed"
        />
      </div>
      <ul className="mb-4 flex gap-2 overflow-x-auto pb-2" aria-label="Photos">
        {photos.map((photo) => {
          const badge = photoBadge(photo);
          return (
            <li key={photo.id}>
              <button
                type="button"
                onClick={() => onSelect(photo.id)}
                aria-pressed={photo.id === selectedId}
                className={`relative block w-28 shrink-0 overflow-hidden rounded-md border-2 text-left ${
                  photo.id === selectedId ? 'border-lagoon-600' : 'border-transparent'
                }`}
              >
                {/* eslint-disable-next-line @next/next/no-img-element -- authenticated thumbnail from our own route */}
                <img
                  src={`/api/photos/${photo.id}/thumbnail`}
                  alt=""
                  className="h-20 w-28 object-cover"
                />
                <span className="block truncate bg-white px-1 text-xs text-ink-800">
                  {photo.name}
                </span>
                <span
                  className={`absolute right-1 top-1 rounded px-1 text-[10px] font-medium text-white ${badge.tone}`}
                >
                  {badge.label}
                </span>
              </button>
            </li>
          );
        })}
      </ul>
    </>
  );
}
