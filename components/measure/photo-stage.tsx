'use client';

import dynamic from 'next/dynamic';
import type { Point } from '@/lib/analysis/types';
import { useWorkspace, type WorkspacePhoto } from './store';

// Konva draws on a real canvas: render it in the browser only.
const DropCanvas = dynamic(() => import('./drop-canvas').then((m) => m.DropCanvas), {
  ssr: false,
  loading: () => <div className="aspect-[4/3] w-full animate-pulse rounded-md bg-ink-100" />,
});

/**
 * The selected photo with its profile and baseline; the baseline's ends drag. While the scale
 * is being measured, clicks pick the needle's edges instead.
 */
export function PhotoStage({
  photo,
  picking,
  onPick,
  onCancelPicking,
}: {
  photo: WorkspacePhoto;
  picking: Point[] | null;
  onPick: (points: Point[]) => void;
  onCancelPicking: () => void;
}) {
  const { selectedHandle, setHandle, setBaseline } = useWorkspace();
  return (
    <>
      {picking ? (
        <p className="mb-2 rounded-md bg-amber-50 px-3 py-2 text-sm text-amber-900">
          Click the left and then the right outer edge of the needle ({picking.length} of 2 picked).{' '}
          <button type="button" className="underline" onClick={onCancelPicking}>
            Cancel
          </button>
        </p>
      ) : null}
      <DropCanvas
        photoId={photo.id}
        imageUrl={`/api/photos/${photo.id}/image`}
        width={photo.width}
        height={photo.height}
        result={photo.result}
        baseline={photo.baseline}
        selectedHandle={selectedHandle}
        onSelectHandle={setHandle}
        onBaselineChange={(baseline) => setBaseline(photo.id, baseline)}
        onPickPoint={picking ? (point) => onPick([...picking, point]) : undefined}
        pickedPoints={picking ?? undefined}
      />
      <div className="mt-2 flex flex-wrap gap-2">
        <button
          type="button"
          className="btn-quiet"
          disabled={!photo.baseline}
          onClick={() => setBaseline(photo.id, null)}
        >
          Use the automatic baseline
        </button>
      </div>
    </>
  );
}
