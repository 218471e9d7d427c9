'use client';

import { create } from 'zustand';
import type { AnalysisResult, Baseline, FitMethod } from '@/lib/analysis/types';
import { DEFAULT_METHOD } from '@/lib/analysis/types';
import type { BaselineHandle } from '@/lib/measure/overlay-geometry';

export type PhotoStatus = 'loading' | 'analysing' | 'ready' | 'failed';

/**
 * Where a photo is in a save: waiting for its turn, being saved, waiting after the server said
 * it was busy (the attempt that failed and the seconds before the next), or not saved.
 */
export type SaveState =
  | { step: 'queued' }
  | { step: 'saving' }
  | { step: 'retrying'; attempt: number; seconds: number }
  | { step: 'failed'; error: string };

export type WorkspacePhoto = {
  id: string;
  name: string;
  width: number;
  height: number;
  status: PhotoStatus;
  error: string | null;
  result: AnalysisResult | null;
  /** The fit this photo is analysed with. */
  method: FitMethod;
  /** The user's baseline; null while the automatic one is used. */
  baseline: Baseline | null;
  /** Where it is saved to ('' until chosen). */
  sampleId: string;
  probeLiquidId: string;
  /** The drop saved from this photo and its latest revision, if any. */
  dropId: string | null;
  savedRevision: number | null;
  /** True when what is shown differs from the saved revision (or nothing is saved). */
  dirty: boolean;
  /** Its place in the save under way or the last one; none when it was not in one. */
  saveState?: SaveState | null;
};

/** A photo as it arrives: uploaded now, or opened with what is saved of it. */
export type IncomingPhoto = Pick<WorkspacePhoto, 'id' | 'name' | 'width' | 'height'> & {
  saved?: {
    dropId: string;
    sampleId: string;
    probeLiquidId: string;
    revision: number;
    method: FitMethod;
    baseline: Baseline | null;
  } | null;
};

type WorkspaceState = {
  photos: WorkspacePhoto[];
  /** The photo on the canvas. */
  selectedId: string | null;
  /** The photos ticked in the table (the selection that is assigned, saved or removed). */
  checked: string[];
  /** The fit for new photos, and the current photo's. */
  method: FitMethod;
  /** Sample and liquid given to new uploads (the last ones chosen). */
  defaults: { sampleId: string; probeLiquidId: string };
  selectedHandle: BaselineHandle | null;
  /** Adds photos not in the table yet; new uploads are ticked and the last one is shown. */
  addPhotos(photos: IncomingPhoto[], options?: { upload?: boolean }): void;
  select(id: string | null): void;
  /** Shows the previous or next photo of those listed. */
  step(ids: string[], by: -1 | 1): void;
  setChecked(ids: string[]): void;
  toggleChecked(id: string): void;
  setMethod(method: FitMethod): void;
  setDefaults(defaults: Partial<WorkspaceState['defaults']>): void;
  /** Puts these photos on a sample and/or liquid. */
  assign(ids: string[], to: { sampleId?: string; probeLiquidId?: string }): void;
  setHandle(handle: BaselineHandle | null): void;
  setStatus(id: string, status: PhotoStatus, error?: string | null): void;
  setResult(id: string, result: AnalysisResult): void;
  setBaseline(id: string, baseline: Baseline | null): void;
  markSaved(id: string, revision: number, dropId?: string): void;
  /** After a stale save: the next save is based on `revision`; the user's work stays. */
  rebase(id: string, revision: number): void;
  setSaveState(ids: string[], saveState: SaveState | null): void;
  removePhotos(ids: string[]): void;
};

const mapPhotos = (
  photos: WorkspacePhoto[],
  ids: string[] | ((p: WorkspacePhoto) => boolean),
  change: (p: WorkspacePhoto) => Partial<WorkspacePhoto>,
) => {
  const hit = typeof ids === 'function' ? ids : (p: WorkspacePhoto) => ids.includes(p.id);
  return photos.map((p) => (hit(p) ? { ...p, ...change(p) } : p));
};

export const useWorkspace = create<WorkspaceState>((set) => ({
  photos: [],
  selectedId: null,
  checked: [],
  method: DEFAULT_METHOD,
  defaults: { sampleId: '', probeLiquidId: '' },
  selectedHandle: null,
  addPhotos: (incoming, options = {}) =>
    set((state) => {
      const known = new Set(state.photos.map((p) => p.id));
      const added = incoming
        .filter((p) => !known.has(p.id))
        .map<WorkspacePhoto>(({ saved, ...p }) => ({
          ...p,
          status: 'loading',
          error: null,
          result: null,
          method: saved?.method ?? state.method,
          baseline: saved?.baseline ?? null,
          sampleId: saved?.sampleId ?? state.defaults.sampleId,
          probeLiquidId: saved?.probeLiquidId ?? state.defaults.probeLiquidId,
          dropId: saved?.dropId ?? null,
          savedRevision: saved?.revision ?? null,
          dirty: !saved,
        }));
      if (options.upload) {
        // An upload of a photo already listed (the same file again) ticks and shows it too.
        const ids = incoming.map((p) => p.id);
        return {
          photos: [...state.photos, ...added],
          selectedId: ids[ids.length - 1] ?? state.selectedId,
          checked: [...state.checked, ...ids.filter((id) => !state.checked.includes(id))],
        };
      }
      if (added.length === 0) return {};
      return {
        photos: [...state.photos, ...added],
        selectedId: state.selectedId ?? added[0].id,
      };
    }),
  select: (id) => set({ selectedId: id, selectedHandle: null }),
  step: (ids, by) =>
    set((state) => {
      if (ids.length === 0) return {};
      const at = ids.indexOf(state.selectedId ?? '');
      const next = at < 0 ? 0 : Math.min(ids.length - 1, Math.max(0, at + by));
      return { selectedId: ids[next], selectedHandle: null };
    }),
  setChecked: (ids) => set({ checked: ids }),
  toggleChecked: (id) =>
    set((state) => ({
      checked: state.checked.includes(id)
        ? state.checked.filter((c) => c !== id)
        : [...state.checked, id],
    })),
  setMethod: (method) =>
    set((state) => ({
      method,
      photos: mapPhotos(
        state.photos,
        (p) => p.id === state.selectedId && p.method !== method,
        () => ({
          method,
          dirty: true,
        }),
      ),
    })),
  setDefaults: (defaults) => set((state) => ({ defaults: { ...state.defaults, ...defaults } })),
  assign: (ids, to) =>
    set((state) => ({
      defaults: { ...state.defaults, ...to },
      photos: mapPhotos(state.photos, ids, (p) => {
        const next = {
          sampleId: to.sampleId ?? p.sampleId,
          probeLiquidId: to.probeLiquidId ?? p.probeLiquidId,
        };
        const moved = next.sampleId !== p.sampleId || next.probeLiquidId !== p.probeLiquidId;
        return { ...next, dirty: p.dirty || moved };
      }),
    })),
  setHandle: (handle) => set({ selectedHandle: handle }),
  setStatus: (id, status, error = null) =>
    set((state) => ({ photos: mapPhotos(state.photos, [id], () => ({ status, error })) })),
  setResult: (id, result) =>
    set((state) => ({
      photos: mapPhotos(state.photos, [id], () => ({ result, status: 'ready', error: null })),
    })),
  setBaseline: (id, baseline) =>
    set((state) => ({ photos: mapPhotos(state.photos, [id], () => ({ baseline, dirty: true })) })),
  markSaved: (id, revision, dropId) =>
    set((state) => ({
      photos: mapPhotos(state.photos, [id], (p) => ({
        savedRevision: revision,
        dropId: dropId ?? p.dropId,
        dirty: false,
        saveState: null,
      })),
    })),
  setSaveState: (ids, saveState) =>
    set((state) => ({ photos: mapPhotos(state.photos, ids, () => ({ saveState })) })),
  rebase: (id, revision) =>
    set((state) => ({ photos: mapPhotos(state.photos, [id], () => ({ savedRevision: revision })) })),
  removePhotos: (ids) =>
    set((state) => {
      const photos = state.photos.filter((p) => !ids.includes(p.id));
      const at = state.photos.findIndex((p) => p.id === state.selectedId);
      const selectedId =
        state.selectedId && ids.includes(state.selectedId)
          ? (photos[Math.min(at, photos.length - 1)]?.id ?? null)
          : state.selectedId;
      return { photos, selectedId, checked: state.checked.filter((c) => !ids.includes(c)) };
    }),
}));

export function useSelectedPhoto(): WorkspacePhoto | null {
  return useWorkspace((state) => state.photos.find((p) => p.id === state.selectedId) ?? null);
}
