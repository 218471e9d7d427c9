'use client';

/*
 * One SWR hook per resource the browser reads after the page has rendered. Pages load the first
 * data on the server and hand it over as `initial`; the hook keeps it, shares it under its URL
 * and updates it after a change.
 */

import type { z } from 'zod';
import { dropOfPhotoResponseSchema } from '@/lib/contracts/drops';
import {
  surfaceEnergyCalculationSchema,
  surfaceEnergyReplySchema,
  type SavedSurfaceEnergyResult,
} from '@/lib/contracts/surface-energy';
import { tensiometryListResponseSchema, type TensiometryResult } from '@/lib/contracts/tensiometry';
import type { SurfaceEnergyMethod } from '@/lib/surface-energy';
import type { LiquidAngle, UncertaintyBasis } from '@/lib/surface-energy/compute';
import {
  dynamicMeasurementSchema,
  type DynamicMeasurementReply,
} from '@/lib/contracts/dynamic';
import { apiFetch, type Wire } from './fetch';
import { useApi, useApiPost } from './swr';

// ---------------------------------------------------------------- photos and their drops

type DropOfPhotoReply = Wire<z.output<typeof dropOfPhotoResponseSchema>>;
export type PhotoDrop = NonNullable<DropOfPhotoReply['drop']>;
export type DropRevision = PhotoDrop['revisions'][number];

export const photoDropUrl = (photoId: string) => `/api/photos/${encodeURIComponent(photoId)}/drop`;

/** The drop saved from a photo with all its revisions, or null while the photo is unsaved. */
export function usePhotoDrop(
  photoId: string | null,
  options: { onLoaded?: (drop: PhotoDrop | null, photoId: string) => void } = {},
) {
  const query = useApi<DropOfPhotoReply>(photoId ? photoDropUrl(photoId) : null, {
    schema: dropOfPhotoResponseSchema,
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

export type SavedTensiometry = Wire<TensiometryResult>;

export const TENSIOMETRY_LIST_URL = '/api/tensiometry?limit=30';

/** The saved tensiometry results, newest first. */
export function useTensiometryResults(initial: SavedTensiometry[]) {
  const query = useApi<{ items: SavedTensiometry[] }>(TENSIOMETRY_LIST_URL, {
    schema: tensiometryListResponseSchema,
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

export type SavedSurfaceEnergy = Wire<SavedSurfaceEnergyResult>;
export type SurfaceEnergySubjectRef = { kind: 'sample' | 'batch'; id: string };

export const surfaceEnergyUrl = (subject: SurfaceEnergySubjectRef) =>
  `/api/${subject.kind === 'batch' ? 'batches' : 'samples'}/${encodeURIComponent(subject.id)}/surface-energy`;

/** The surface-energy results saved with a sample or a batch, newest first. */
export function useSavedSurfaceEnergy(
  subject: SurfaceEnergySubjectRef,
  initial: SavedSurfaceEnergy[],
) {
  const query = useApi<{ saved: SavedSurfaceEnergy[] }>(surfaceEnergyUrl(subject), {
    schema: surfaceEnergyReplySchema,
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

type SurfaceEnergyCalculationReply = Wire<z.output<typeof surfaceEnergyCalculationSchema>>;

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
  initial: SurfaceEnergyCalculationReply['outputs'] | null,
) {
  // Only the outputs are read; the page's first render hands over only those.
  const query = useApiPost<Pick<SurfaceEnergyCalculationReply, 'outputs'>>(
    '/api/surface-energy/calculate',
    input,
    {
      schema: surfaceEnergyCalculationSchema,
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

// ---------------------------------------------------------------- dynamic measurements

export type SavedDynamicMeasurement = Wire<DynamicMeasurementReply>;

export const dynamicMeasurementUrl = (id: string) =>
  `/api/dynamic-measurements/${encodeURIComponent(id)}`;

/** A saved dynamic measurement with its newest result and the server's per-frame series. */
export function fetchDynamicMeasurement(id: string): Promise<SavedDynamicMeasurement> {
  return apiFetch<SavedDynamicMeasurement>(dynamicMeasurementUrl(id), {
    schema: dynamicMeasurementSchema,
  });
}
