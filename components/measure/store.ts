'use client';

import { create } from 'zustand';
import type { AnalysisResult, Baseline, FitMethod } from '@/lib/analysis/types';
import { DEFAULT_METHOD } from '@/lib/analysis/types';
import type { BaselineHandle } from '@/lib/measure/overlay-geometry';

export type PhotoStatus = 'loading' | 'analysing' | 'ready' | 'failed';

export type WorkspacePhoto = {
  id: string;
  name: string;
  width: number;
  height: number;
  status: PhotoStatus;
  error: string | null;
  result: AnalysisResult | null;
  /** The user's baseline; null while the automatic one is used. */
  baseline: Baseline | null;
  /** Latest saved revision of this photo's drop, if any. */
  savedRevision: number | null;
  /** True when the shown result differs from the saved revision. */
  dirty: boolean;
};

type WorkspaceState = {
  photos: WorkspacePhoto[];
  selectedId: string | null;
  method: FitMethod;
  selectedHandle: BaselineHandle | null;
  addPhotos(photos: Pick<WorkspacePhoto, 'id' | 'name' | 'width' | 'height'>[]): void;
  select(id: string | null): void;
  setMethod(method: FitMethod): void;
  setHandle(handle: BaselineHandle | null): void;
  setStatus(id: string, status: PhotoStatus, error?: string | null): void;
  setResult(id: string, result: AnalysisResult): void;
  setBaseline(id: string, baseline: Baseline | null): void;
  markSaved(id: string, revision: number): void;
  /** After a stale save: the next save is based on `revision`; the user's work stays. */
  rebase(id: string, revision: number): void;
  removePhoto(id: string): void;
};

export const useWorkspace = create<WorkspaceState>((set) => ({
  photos: [],
  selectedId: null,
  method: DEFAULT_METHOD,
  selectedHandle: null,
  addPhotos: (incoming) =>
    set((state) => {
      const known = new Set(state.photos.map((p) => p.id));
      const added = incoming
        .filter((p) => !known.has(p.id))
        .map<WorkspacePhoto>((p) => ({
          ...p,
          status: 'loading',
          error: null,
          result: null,
          baseline: null,
          savedRevision: null,
          dirty: true,
        }));
      return {
        photos: [...state.photos, ...added],
        selectedId: state.selectedId ?? added[0]?.id ?? null,
      };
    }),
  select: (id) => set({ selectedId: id, selectedHandle: null }),
  setMethod: (method) =>
    set((state) => ({ method, photos: state.photos.map((p) => ({ ...p, dirty: true })) })),
  setHandle: (handle) => set({ selectedHandle: handle }),
  setStatus: (id, status, error = null) =>
    set((state) => ({
      photos: state.photos.map((p) => (p.id === id ? { ...p, status, error } : p)),
    })),
  setResult: (id, result) =>
    set((state) => ({
      photos: state.photos.map((p) =>
        p.id === id ? { ...p, result, status: 'ready', error: null } : p,
      ),
    })),
  setBaseline: (id, baseline) =>
    set((state) => ({
      photos: state.photos.map((p) => (p.id === id ? { ...p, baseline, dirty: true } : p)),
    })),
  markSaved: (id, revision) =>
    set((state) => ({
      photos: state.photos.map((p) =>
        p.id === id ? { ...p, savedRevision: revision, dirty: false } : p,
      ),
    })),
  rebase: (id, revision) =>
    set((state) => ({
      photos: state.photos.map((p) => (p.id === id ? { ...p, savedRevision: revision } : p)),
    })),
  removePhoto: (id) =>
    set((state) => {
      const photos = state.photos.filter((p) => p.id !== id);
      return {
        photos,
        selectedId: state.selectedId === id ? (photos[0]?.id ?? null) : state.selectedId,
      };
    }),
}));

export function useSelectedPhoto(): WorkspacePhoto | null {
  return useWorkspace((state) => state.photos.find((p) => p.id === state.selectedId) ?? null);
}
