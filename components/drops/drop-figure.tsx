'use client';

import dynamic from 'next/dynamic';
import { useEffect, useState } from 'react';
import type { AnalyseOptions, AnalysisResult } from '@/lib/analysis/types';
import { Superseded, useAnalysisWorker } from '@/components/measure/use-analysis';

const DropCanvas = dynamic(
  () => import('@/components/measure/drop-canvas').then((m) => m.DropCanvas),
  {
    ssr: false,
    loading: () => <div className="aspect-[4/3] w-full animate-pulse rounded-md bg-ink-100" />,
  },
);

/**
 * A saved drop's photo with its edge points, fitted profile and tangents: the revision's method,
 * baseline, scale and settings analysed again in the browser from the server's own pixels (the
 * same pixels the saved angles were computed from), drawn without handles.
 */
export function DropFigure({
  photoId,
  width,
  height,
  options,
  savedLeftDeg,
  savedRightDeg,
}: {
  photoId: string;
  width: number;
  height: number;
  options: AnalyseOptions;
  savedLeftDeg: number;
  savedRightDeg: number;
}) {
  const worker = useAnalysisWorker();
  const [result, setResult] = useState<AnalysisResult | null>(null);
  const [error, setError] = useState<string | null>(null);
  const key = JSON.stringify(options);
  useEffect(() => {
    let live = true;
    worker
      .analyse(photoId, JSON.parse(key) as AnalyseOptions)
      .then((r) => live && setResult(r))
      .catch((e: unknown) => {
        if (live && e instanceof Error && !(e instanceof Superseded)) setError(e.message);
      });
    return () => {
      live = false;
    };
  }, [worker, photoId, key]);
  const agrees =
    result &&
    Math.abs(result.leftDeg - savedLeftDeg) < 0.05 &&
    Math.abs(result.rightDeg - savedRightDeg) < 0.05;
  return (
    <figure>
      <DropCanvas
        photoId={photoId}
        imageUrl={`/api/photos/${photoId}/image`}
        width={width}
        height={height}
        result={result}
        baseline={options.baseline ?? null}
        selectedHandle={null}
        onSelectHandle={() => undefined}
        onBaselineChange={() => undefined}
        readOnly
      />
      <figcaption className="mt-2 text-xs text-ink-600" role="status">
        {error
          ? `The photo could not be drawn with its fit: ${error}`
          : !result
            ? 'Drawing the fit…'
            : agrees
              ? 'Edge points, fitted profile and tangents of the revision shown, recomputed from the stored photo: the angles match the saved ones.'
              : `Recomputed here: left ${result.leftDeg.toFixed(2)}°, right ${result.rightDeg.toFixed(2)}° (saved: ${savedLeftDeg.toFixed(2)}°, ${savedRightDeg.toFixed(2)}°; saved with an earlier engine version).`}
      </figcaption>
    </figure>
  );
}
