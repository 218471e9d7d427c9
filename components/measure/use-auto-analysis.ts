'use client';

import { useCallback, useEffect, useRef } from 'react';
import type { AnalyseOptions } from '@/lib/analysis/types';
import { useWorkspace, type IncomingPhoto, type WorkspacePhoto } from './store';
import { Superseded, useAnalysisWorker } from './use-analysis';

/**
 * Analyses every photo of the table in the browser on arrival, in the table's order, and again
 * whenever its method, its baseline or the camera scale changes.
 */
export function useAutoAnalysis(scalePxPerMm: number | null) {
  const { photos, setStatus, setResult } = useWorkspace();
  const worker = useAnalysisWorker();

  const optionsFor = useCallback(
    (photo: WorkspacePhoto): AnalyseOptions => ({
      method: photo.method,
      ...(photo.baseline ? { baseline: photo.baseline } : {}),
      ...(scalePxPerMm ? { scalePxPerMm } : {}),
    }),
    [scalePxPerMm],
  );

  const run = useCallback(
    async (photo: WorkspacePhoto, options: AnalyseOptions) => {
      setStatus(photo.id, 'analysing');
      try {
        const result = await worker.analyse(photo.id, options);
        setResult(photo.id, result);
      } catch (error) {
        if (error instanceof Superseded) return;
        setStatus(
          photo.id,
          'failed',
          error instanceof Error ? error.message : 'The analysis failed.',
        );
      }
    },
    [worker, setStatus, setResult],
  );

  const lastRun = useRef(new Map<string, string>());
  useEffect(() => {
    for (const photo of photos) {
      const options = optionsFor(photo);
      const key = JSON.stringify(options);
      if (lastRun.current.get(photo.id) === key) continue;
      lastRun.current.set(photo.id, key);
      void run(photo, options);
    }
  }, [photos, optionsFor, run]);
}

/**
 * Puts the photos the page opened with into the table once, and keeps the table's photo ids in
 * the address so a reload (or a shared link) reopens the same photos.
 */
export function useStripInAddress(initialPhotos: IncomingPhoto[]) {
  const { photos, addPhotos } = useWorkspace();
  const seeded = useRef(false);
  useEffect(() => {
    if (seeded.current) return;
    seeded.current = true;
    if (initialPhotos.length) addPhotos(initialPhotos);
  }, [initialPhotos, addPhotos]);

  const photoIds = photos.map((p) => p.id).join(',');
  useEffect(() => {
    if (!seeded.current) return;
    const url = new URL(window.location.href);
    if (photoIds) url.searchParams.set('photos', photoIds);
    else url.searchParams.delete('photos');
    window.history.replaceState(window.history.state, '', url);
  }, [photoIds]);
}
