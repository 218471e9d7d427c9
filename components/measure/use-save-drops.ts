'use client';

import { useState } from 'react';
import { ApiError } from '@/components/data/api-error';
import { useMutation, type MutationResult } from '@/components/data/use-mutation';
import { COMPUTE_JOBS_PER_USER } from '@/lib/contracts/limits';
import { measurementSessionReplies } from '@/lib/contracts/measurement-sessions';
import { useWorkspace, type WorkspacePhoto } from './store';
import { scaleOf, type SessionDetails } from './types';

export type SaveMessage = { kind: 'ok' | 'error'; text: string };

/** A save refused because the drop was saved since it was loaded: the revision it has now. */
export type StaleSave = { photoId: string; photoName: string; current: number };

/** The latest revision a 409 stale_revision names, or null for any other error. */
function staleRevisionOf(error: unknown): number | null {
  if (!(error instanceof ApiError) || error.code !== 'stale_revision') return null;
  const current = error.extra.current as { revision?: unknown } | undefined;
  return typeof current?.revision === 'number' ? current.revision : null;
}

/**
 * Saves sent at once by one workspace: below the server's COMPUTE_JOBS_PER_USER, so a pendant
 * fit or another tab of the same user still gets a place.
 */
export const SAVES_AT_ONCE = COMPUTE_JOBS_PER_USER - 1;
/** Attempts of one save while the server answers 429 `busy`. */
export const BUSY_ATTEMPTS = 8;

/**
 * How long to wait after the `attempt`-th busy answer: what the server's Retry-After asks, and
 * at least 2 s doubling with each attempt, at most 30 s.
 */
export function busyWaitMs(attempt: number, retryAfterSeconds: number | null): number {
  const backoff = Math.min(30_000, 2_000 * 2 ** (attempt - 1));
  return Math.min(30_000, Math.max(backoff, (retryAfterSeconds ?? 0) * 1000));
}

const errorText = (error: unknown) => (error instanceof Error ? error.message : 'not saved');

const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

const must = <T>(result: MutationResult<T>): T => {
  if (!result.ok) throw result.error;
  return result.data;
};

/** What stops a photo from being saved, in words; null when it can be. */
export function saveProblem(photo: WorkspacePhoto, reason: string): string | null {
  if (photo.status !== 'ready') return `${photo.name} has no result to save.`;
  if (!photo.sampleId) return `Choose the sample ${photo.name} was placed on, then save.`;
  if (!photo.probeLiquidId) return `Choose the probe liquid of ${photo.name}, then save.`;
  if (photo.savedRevision !== null && !reason.trim())
    return `${photo.name} is saved already: say why it is analysed again.`;
  return null;
}

/**
 * Saving analysed photos, each to its own sample and probe liquid: the session is created on the
 * first save with its details (a reopened drop keeps its own session unless the details
 * changed), then each photo's drop is saved (the server re-analyses the stored photo with the
 * same method and baseline), a few at a time, waiting and sending again while the server is
 * busy; each photo's row says where it is. A re-save carries the reason the user gave.
 */
export function useSaveDrops({
  session,
  onSessionCreated,
  onSaved,
  wait = sleep,
}: {
  session: SessionDetails;
  onSessionCreated: (sessionId: string) => void;
  /** After a save, e.g. to reload the selected photo's revisions. */
  onSaved: () => Promise<unknown>;
  /** Waits between attempts after a busy answer (tests pass one that records the waits). */
  wait?: (ms: number) => Promise<void>;
}) {
  const markSaved = useWorkspace((state) => state.markSaved);
  const setSaveState = useWorkspace((state) => state.setSaveState);
  const rebase = useWorkspace((state) => state.rebase);
  const select = useWorkspace((state) => state.select);
  const [stale, setStale] = useState<StaleSave[]>([]);
  const send = useMutation();
  const [message, setMessage] = useState<SaveMessage | null>(null);
  const [saving, setSaving] = useState(false);
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const scale = scaleOf(session);

  async function ensureSession(liquidIds: string[]): Promise<string> {
    if (session.sessionId) return session.sessionId;
    const liquids = [...new Set(liquidIds)];
    const created = must(
      await send.run('/api/measurement-sessions', {
        method: 'POST',
        json: {
          operatorName: session.operatorName,
          measuredAt: new Date().toISOString(),
          // One liquid for the sitting when all its drops share it.
          probeLiquidId: liquids.length === 1 ? liquids[0] : undefined,
          temperatureC: session.temperatureC ? Number(session.temperatureC) : undefined,
          humidityPct: session.humidityPct ? Number(session.humidityPct) : undefined,
          dropVolumeUl: session.dropVolumeUl ? Number(session.dropVolumeUl) : undefined,
          scalePxPerMm: scale ?? undefined,
          instrumentNotes: '',
          liquidLot: session.liquidLot.trim(),
        },
        schema: measurementSessionReplies.one,
      }),
    ) as { id: string } | { measurementSession: { id: string } };
    const id = 'id' in created ? created.id : created.measurementSession.id;
    onSessionCreated(id);
    return id;
  }

  async function savePhoto(photo: WorkspacePhoto, sessionId: string, reason: string) {
    const saved = must(
      await send.run(`/api/photos/${photo.id}/drop`, {
        method: 'POST',
        json: {
          sampleId: photo.sampleId,
          probeLiquidId: photo.probeLiquidId,
          sessionId,
          method: photo.method,
          baseline: photo.baseline,
          scalePxPerMm: scale,
          ...(photo.savedRevision !== null ? { reason: reason.trim() } : {}),
          expectedRevision: photo.savedRevision ?? 0,
        },
      }),
    ) as { revision: number; dropId: string };
    setStale((list) => list.filter((s) => s.photoId !== photo.id));
    markSaved(photo.id, saved.revision, saved.dropId);
    return saved.revision;
  }

  /** Notes a stale save so the workspace can offer to reload that drop's current revision. */
  function noteStale(photo: WorkspacePhoto, error: unknown) {
    const current = staleRevisionOf(error);
    if (current === null) return;
    setStale((list) => [
      ...list.filter((s) => s.photoId !== photo.id),
      { photoId: photo.id, photoName: photo.name, current },
    ]);
  }

  /** Takes the drop's current revision as the base of the next save and shows it. */
  async function reloadCurrent(entry: StaleSave) {
    rebase(entry.photoId, entry.current);
    select(entry.photoId);
    setStale((list) => list.filter((s) => s.photoId !== entry.photoId));
    setMessage({
      kind: 'ok',
      text: `Revision ${entry.current} of ${entry.photoName} is loaded in Saved revisions. Saving again makes your analysis revision ${entry.current + 1}.`,
    });
    await onSaved();
  }

  /** Runs `save` with the checks, the busy state and the message around it. */
  async function guarded(
    photos: WorkspacePhoto[],
    reason: string,
    save: () => Promise<SaveMessage>,
  ) {
    const problem = photos.length
      ? photos.map((p) => saveProblem(p, reason)).find(Boolean)
      : 'Tick the photos to save.';
    if (problem) {
      setMessage({ kind: 'error', text: problem });
      return;
    }
    setSaving(true);
    setMessage(null);
    try {
      setMessage(await save());
    } catch (error) {
      setMessage({
        kind: 'error',
        text: error instanceof Error ? error.message : 'Saving failed.',
      });
    } finally {
      setSaving(false);
      setProgress(null);
    }
  }

  /** Saves one photo; after a 429 `busy` it waits and sends again, saying so in its row. */
  async function saveWithRetries(photo: WorkspacePhoto, sessionId: string, reason: string) {
    for (let attempt = 1; ; attempt += 1) {
      setSaveState([photo.id], { step: 'saving' });
      try {
        return await savePhoto(photo, sessionId, reason);
      } catch (error) {
        const busy = error instanceof ApiError && error.code === 'busy';
        if (!busy || attempt >= BUSY_ATTEMPTS) throw error;
        const ms = busyWaitMs(attempt, error.retryAfterSeconds);
        setSaveState([photo.id], { step: 'retrying', attempt, seconds: Math.round(ms / 1000) });
        await wait(ms);
      }
    }
  }

  /**
   * Saves the photos, SAVES_AT_ONCE at a time (each save is a computation on the server, which
   * takes COMPUTE_JOBS_PER_USER per user at once). Every photo is saved or named with why not;
   * one that is not saved stays in the workspace as it was.
   */
  async function saveQueued(photos: WorkspacePhoto[], reason: string) {
    setSaveState(
      photos.map((p) => p.id),
      { step: 'queued' },
    );
    const failures: { at: number; photo: WorkspacePhoto; error: unknown }[] = [];
    let revision = 0;
    try {
      const sessionId = await ensureSession(photos.map((p) => p.probeLiquidId));
      let next = 0;
      let done = 0;
      const lane = async () => {
        while (next < photos.length) {
          const at = next++;
          const photo = photos[at];
          try {
            revision = await saveWithRetries(photo, sessionId, reason);
          } catch (error) {
            noteStale(photo, error);
            setSaveState([photo.id], { step: 'failed', error: errorText(error) });
            failures.push({ at, photo, error });
          }
          done += 1;
          if (photos.length > 1) setProgress({ done, total: photos.length });
        }
      };
      await Promise.all(Array.from({ length: Math.min(SAVES_AT_ONCE, photos.length) }, lane));
    } catch (error) {
      // No session: nothing was sent; the photos wait as they were.
      setSaveState(
        photos.map((p) => p.id),
        null,
      );
      throw error;
    }
    return { failures: failures.sort((x, y) => x.at - y.at), revision };
  }

  const saveOne = (photo: WorkspacePhoto, reason = '') =>
    guarded([photo], reason, async () => {
      const { failures, revision } = await saveQueued([photo], reason);
      if (failures.length) throw failures[0].error;
      await onSaved();
      return { kind: 'ok', text: `Saved as revision ${revision}.` };
    });

  const saveMany = (photos: WorkspacePhoto[], reason = '') =>
    guarded(photos, reason, async () => {
      setProgress({ done: 0, total: photos.length });
      const { failures } = await saveQueued(photos, reason);
      await onSaved();
      return failures.length
        ? {
            kind: 'error',
            text: `Saved ${photos.length - failures.length} of ${photos.length}. Not saved: ${failures.map((f) => `${f.photo.name}: ${errorText(f.error)}`).join('; ')}`,
          }
        : { kind: 'ok', text: `Saved ${photos.length} drop${photos.length === 1 ? '' : 's'}.` };
    });

  return { saveOne, saveMany, saving, progress, message, stale, reloadCurrent };
}
