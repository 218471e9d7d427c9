'use client';

import { useState } from 'react';
import { ApiError } from '@/components/data/api-error';
import { useMutation, type MutationResult } from '@/components/data/use-mutation';
import type { FitMethod } from '@/lib/analysis/types';
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

const must = <T>(result: MutationResult<T>): T => {
  if (!result.ok) throw result.error;
  return result.data;
};

/**
 * Saving analysed photos to a sample: the session is created on the first save with its
 * details, then each photo's drop is saved (the server re-analyses the stored photo with the
 * same method and baseline). One photo, or every analysed photo not saved yet.
 */
export function useSaveDrops({
  sampleId,
  session,
  onSessionCreated,
  method,
  onSaved,
}: {
  sampleId: string;
  session: SessionDetails;
  onSessionCreated: (sessionId: string) => void;
  method: FitMethod;
  /** After a save, e.g. to reload the selected photo's revisions. */
  onSaved: () => Promise<unknown>;
}) {
  const markSaved = useWorkspace((state) => state.markSaved);
  const rebase = useWorkspace((state) => state.rebase);
  const select = useWorkspace((state) => state.select);
  const [stale, setStale] = useState<StaleSave[]>([]);
  const send = useMutation();
  const [message, setMessage] = useState<SaveMessage | null>(null);
  const [saving, setSaving] = useState(false);
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const scale = scaleOf(session);

  async function ensureSession(): Promise<string> {
    if (session.sessionId) return session.sessionId;
    const created = must(
      await send.run('/api/measurement-sessions', {
        method: 'POST',
        json: {
          operatorName: session.operatorName,
          measuredAt: new Date().toISOString(),
          probeLiquidId: session.probeLiquidId || undefined,
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

  async function savePhoto(photo: WorkspacePhoto, sessionId: string): Promise<number> {
    const saved = must(
      await send.run(`/api/photos/${photo.id}/drop`, {
        method: 'POST',
        json: {
          sampleId,
          probeLiquidId: session.probeLiquidId,
          sessionId,
          method,
          baseline: photo.baseline,
          scalePxPerMm: scale,
          expectedRevision: photo.savedRevision ?? 0,
        },
      }),
    ) as { revision: number };
    setStale((list) => list.filter((s) => s.photoId !== photo.id));
    markSaved(photo.id, saved.revision);
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

  function problemBeforeSave(): string | null {
    if (!sampleId) return 'Choose the sample these drops were placed on, then save.';
    if (!session.probeLiquidId) return 'Choose the probe liquid, then save.';
    return null;
  }

  /** Runs `save` with the checks, the busy state and the message around it. */
  async function guarded(save: () => Promise<SaveMessage>) {
    const problem = problemBeforeSave();
    if (problem) return setMessage({ kind: 'error', text: problem });
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

  const saveOne = (photo: WorkspacePhoto) =>
    guarded(async () => {
      const sessionId = await ensureSession();
      let revision: number;
      try {
        revision = await savePhoto(photo, sessionId);
      } catch (error) {
        noteStale(photo, error);
        throw error;
      }
      await onSaved();
      return { kind: 'ok', text: `Saved as revision ${revision}.` };
    });

  const saveAll = (photos: WorkspacePhoto[]) =>
    guarded(async () => {
      const toSave = photos.filter((p) => p.status === 'ready' && p.dirty);
      setProgress({ done: 0, total: toSave.length });
      const sessionId = await ensureSession();
      const failures: string[] = [];
      for (const [i, photo] of toSave.entries()) {
        try {
          await savePhoto(photo, sessionId);
        } catch (error) {
          noteStale(photo, error);
          failures.push(`${photo.name}: ${error instanceof Error ? error.message : 'not saved'}`);
        }
        setProgress({ done: i + 1, total: toSave.length });
      }
      await onSaved();
      return failures.length
        ? {
            kind: 'error',
            text: `Saved ${toSave.length - failures.length} of ${toSave.length}. Not saved: ${failures.join('; ')}`,
          }
        : { kind: 'ok', text: `Saved ${toSave.length} drop${toSave.length === 1 ? '' : 's'}.` };
    });

  return { saveOne, saveAll, saving, progress, message, stale, reloadCurrent };
}
