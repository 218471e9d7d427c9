'use client';

/*
 * One SWR hook per resource the browser reads after the page has rendered. Pages load the first
 * data on the server and hand it over as `initial`; the hook keeps it, shares it under its URL
 * and updates it after a change.
 */

import type { SavedSurfaceEnergyResult } from '@/db/queries/surface-energy';
import type { TensiometryResult } from '@/db/queries/tensiometry';
import type { Baseline } from '@/lib/analysis/types';
import type { SurfaceEnergyMethod } from '@/lib/surface-energy';
import type {
  LiquidAngle,
  SurfaceEnergyOutputs,
  UncertaintyBasis,
} from '@/lib/validation/surface-energy';
import { useApi, useApiPost } from './swr';

/** Dates arrive as ISO text. */
type Serialized<T> = Omit<T, 'createdAt'> & { createdAt: string };

// ---------------------------------------------------------------- photos and their drops

export type DropRevision = {
  id: string;
  revision: number;
  method: string;
  leftDeg: number;
  rightDeg: number;
  meanDeg: number;
  leftUncertaintyDeg: number | null;
  rightUncertaintyDeg: number | null;
  baseline: Baseline | null;
  createdAt: string;
  reviewStatus: string;
};

export type PhotoDrop = {
  id: string;
  sampleId: string;
  probeLiquidId: string;
  sampleLabel: string;
  lotCode: string;
  coatingCode: string;
  /** Newest first. */
  revisions: DropRevision[];
};

export const photoDropUrl = (photoId: string) => `/api/photos/${encodeURIComponent(photoId)}/drop`;

/** The drop saved from a photo with all its revisions, or null while the photo is unsaved. */
export function usePhotoDrop(
  photoId: string | null,
  options: { onLoaded?: (drop: PhotoDrop | null, photoId: string) => void } = {},
) {
  const query = useApi<{ drop: PhotoDrop | null }>(photoId ? photoDropUrl(photoId) : null, {
    // The photo of the answer, which may no longer be the one selected.
    onSuccess: (data, key: string) =>
      options.onLoaded?.(data.drop, decodeURIComponent(key.split('/')[3] ?? '')),
  });
  return {
    drop: query.data?.drop ?? null,
    error: query.error ?? null,
    reload: () => query.mutate(),
  };
}

// ---------------------------------------------------------------- tensiometry

export type SavedTensiometry = Serialized<TensiometryResult>;

export const TENSIOMETRY_LIST_URL = '/api/tensiometry?limit=30';

/** The saved tensiometry results, newest first. */
export function useTensiometryResults(initial: SavedTensiometry[]) {
  const query = useApi<{ items: SavedTensiometry[] }>(TENSIOMETRY_LIST_URL, {
    fallbackData: { items: initial },
  });
  return {
    results: query.data?.items ?? initial,
    /** Puts a result just saved at the top without asking the server again. */
    add: (saved: SavedTensiometry) =>
      void query.mutate((list) => ({ items: [saved, ...(list?.items ?? initial)] }), {
        revalidate: false,
      }),
  };
}

// ---------------------------------------------------------------- surface energy

export type SavedSurfaceEnergy = Serialized<SavedSurfaceEnergyResult>;
export type SurfaceEnergySubjectRef = { kind: 'sample' | 'batch'; id: string };

export const surfaceEnergyUrl = (subject: SurfaceEnergySubjectRef) =>
  `/api/${subject.kind === 'batch' ? 'batches' : 'samples'}/${encodeURIComponent(subject.id)}/surface-energy`;

/** The surface-energy results saved with a sample or a batch, newest first. */
export function useSavedSurfaceEnergy(
  subject: SurfaceEnergySubjectRef,
  initial: SavedSurfaceEnergy[],
) {
  const query = useApi<{ saved: SavedSurfaceEnergy[] }>(surfaceEnergyUrl(subject), {
    fallbackData: { saved: initial },
  });
  return {
    saved: query.data?.saved ?? initial,
    add: (result: SavedSurfaceEnergy) =>
      void query.mutate((data) => ({ ...data, saved: [result, ...(data?.saved ?? initial)] }), {
        revalidate: false,
      }),
  };
}

/**
 * Surface energy computed from the liquids' mean angles with the chosen methods. The answer for
 * the page's first choice comes from the server render; while a new choice is computed the
 * previous result stays on screen.
 */
export function useSurfaceEnergyCalculation(
  input: {
    liquids: LiquidAngle[];
    methods: SurfaceEnergyMethod[];
    uncertaintyBasis: UncertaintyBasis;
  } | null,
  initial: SurfaceEnergyOutputs | null,
) {
  const query = useApiPost<{ outputs: SurfaceEnergyOutputs }>(
    '/api/surface-energy/calculate',
    input,
    {
      fallbackData: initial ? { outputs: initial } : undefined,
      keepPreviousData: true,
    },
  );
  return {
    outputs: query.data?.outputs ?? null,
    error: query.error ?? null,
    computing: query.isValidating,
  };
}
