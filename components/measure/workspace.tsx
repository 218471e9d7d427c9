'use client';

import dynamic from 'next/dynamic';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import useSWR from 'swr';
import type { AnalyseOptions, Baseline, FitMethod, Point } from '@/lib/analysis/types';
import { FIT_METHODS } from '@/lib/analysis/types';
import { apiFetch, ApiError, swrFetcher } from './api';
import { ResultsPanel } from './results-panel';
import { SessionPanel, type SessionDetails } from './session-panel';
import { useSelectedPhoto, useWorkspace, type WorkspacePhoto } from './store';
import { PhotoDropZone, type UploadedPhoto } from './uploads';
import { Superseded, useAnalysisWorker } from './use-analysis';

// Konva draws on a real canvas: render it in the browser only.
const DropCanvas = dynamic(() => import('./drop-canvas').then((m) => m.DropCanvas), {
  ssr: false,
  loading: () => <div className="aspect-[4/3] w-full animate-pulse rounded-md bg-ink-100" />,
});

export type SampleChoice = { id: string; label: string; lotCode: string; coatingCode: string; coatingName: string };
export type LiquidChoice = { id: string; name: string; hazardNote: string | null };

const METHOD_LABELS: Record<FitMethod, string> = {
  'young-laplace': 'Young–Laplace (gravity-deformed drop)',
  circle: 'Circle (spherical cap)',
  polynomial: 'Polynomial tangent',
  ellipse: 'Ellipse',
  'height-width': 'Height–width (θ/2)',
};

type Revision = {
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
type DropResponse = {
  drop: null | { id: string; sampleId: string; probeLiquidId: string; sampleLabel: string; lotCode: string; coatingCode: string; revisions: Revision[] };
};

export function MeasureWorkspace(props: {
  samples: SampleChoice[];
  liquids: LiquidChoice[];
  initialPhotos: UploadedPhoto[];
  initialSampleId: string | null;
  operatorName: string;
}) {
  const { photos, method, selectedHandle, addPhotos, select, setMethod, setHandle, setStatus, setResult, setBaseline, markSaved } =
    useWorkspace();
  const selected = useSelectedPhoto();
  const worker = useAnalysisWorker();
  const [sampleId, setSampleId] = useState(props.initialSampleId ?? '');
  const [session, setSession] = useState<SessionDetails>({
    probeLiquidId: props.liquids.find((l) => /water/i.test(l.name))?.id ?? props.liquids[0]?.id ?? '',
    operatorName: props.operatorName,
    temperatureC: '23',
    humidityPct: '50',
    dropVolumeUl: '3',
    scalePxPerMm: '',
    sessionId: null,
  });
  const [saveMessage, setSaveMessage] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [saving, setSaving] = useState(false);
  const [batchProgress, setBatchProgress] = useState<{ done: number; total: number } | null>(null);
  const [picking, setPicking] = useState<Point[] | null>(null);
  const seeded = useRef(false);

  useEffect(() => {
    if (seeded.current) return;
    seeded.current = true;
    if (props.initialPhotos.length) addPhotos(props.initialPhotos);
  }, [props.initialPhotos, addPhotos]);

  // Keep the strip in the address so a reload (or a shared link) reopens the same photos.
  const photoIds = photos.map((p) => p.id).join(',');
  useEffect(() => {
    if (!photoIds) return;
    const url = new URL(window.location.href);
    url.searchParams.set('photos', photoIds);
    window.history.replaceState(window.history.state, '', url);
  }, [photoIds]);

  const scale = Number(session.scalePxPerMm);
  const optionsFor = useCallback(
    (photo: WorkspacePhoto): AnalyseOptions => ({
      method,
      ...(photo.baseline ? { baseline: photo.baseline } : {}),
      ...(scale > 0 ? { scalePxPerMm: scale } : {}),
    }),
    [method, scale],
  );

  const run = useCallback(
    async (photo: WorkspacePhoto, options: AnalyseOptions) => {
      setStatus(photo.id, 'analysing');
      try {
        const result = await worker.analyse(photo.id, options);
        setResult(photo.id, result);
      } catch (error) {
        if (error instanceof Superseded) return;
        setStatus(photo.id, 'failed', error instanceof Error ? error.message : 'The analysis failed.');
      }
    },
    [worker, setStatus, setResult],
  );

  // Analyse every photo on arrival, and again whenever its method, baseline or scale changes.
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

  const selectedId = selected?.id ?? null;
  const drop = useSWR<DropResponse>(selectedId ? `/api/photos/${selectedId}/drop` : null, swrFetcher, {
    // A photo saved earlier opens with its saved sample and latest revision.
    onSuccess: (data) => {
      const saved = data.drop;
      const photo = useWorkspace.getState().photos.find((p) => p.id === selectedId);
      if (saved && photo && photo.savedRevision === null) {
        setSampleId(saved.sampleId);
        markSaved(photo.id, saved.revisions[0]?.revision ?? 0);
      }
    },
  });

  async function ensureSession(): Promise<string | null> {
    if (session.sessionId) return session.sessionId;
    const created = await apiFetch<{ id: string } | { measurementSession: { id: string } }>('/api/measurement-sessions', {
      method: 'POST',
      json: {
        operatorName: session.operatorName,
        measuredAt: new Date().toISOString(),
        probeLiquidId: session.probeLiquidId || undefined,
        temperatureC: session.temperatureC ? Number(session.temperatureC) : undefined,
        humidityPct: session.humidityPct ? Number(session.humidityPct) : undefined,
        dropVolumeUl: session.dropVolumeUl ? Number(session.dropVolumeUl) : undefined,
        scalePxPerMm: scale > 0 ? scale : undefined,
        instrumentNotes: '',
      },
    });
    const id = 'id' in created ? created.id : created.measurementSession.id;
    setSession((s) => ({ ...s, sessionId: id }));
    return id;
  }

  async function savePhoto(photo: WorkspacePhoto, sessionId: string | null) {
    const saved = await apiFetch<{ revision: number }>(`/api/photos/${photo.id}/drop`, {
      method: 'POST',
      json: {
        sampleId,
        probeLiquidId: session.probeLiquidId,
        sessionId,
        method,
        baseline: photo.baseline,
        scalePxPerMm: scale > 0 ? scale : null,
      },
    });
    markSaved(photo.id, saved.revision);
    return saved.revision;
  }

  function problemBeforeSave(): string | null {
    if (!sampleId) return 'Choose the sample these drops were placed on, then save.';
    if (!session.probeLiquidId) return 'Choose the probe liquid, then save.';
    return null;
  }

  async function onSave() {
    if (!selected) return;
    const problem = problemBeforeSave();
    if (problem) return setSaveMessage({ kind: 'error', text: problem });
    setSaving(true);
    setSaveMessage(null);
    try {
      const sessionId = await ensureSession();
      const revision = await savePhoto(selected, sessionId);
      await drop.mutate();
      setSaveMessage({ kind: 'ok', text: `Saved as revision ${revision}.` });
    } catch (error) {
      setSaveMessage({ kind: 'error', text: error instanceof ApiError || error instanceof Error ? error.message : 'Saving failed.' });
    } finally {
      setSaving(false);
    }
  }

  async function onSaveAll() {
    const problem = problemBeforeSave();
    if (problem) return setSaveMessage({ kind: 'error', text: problem });
    const toSave = photos.filter((p) => p.status === 'ready' && p.dirty);
    setSaving(true);
    setSaveMessage(null);
    setBatchProgress({ done: 0, total: toSave.length });
    const failures: string[] = [];
    try {
      const sessionId = await ensureSession();
      for (const [i, photo] of toSave.entries()) {
        try {
          await savePhoto(photo, sessionId);
        } catch (error) {
          failures.push(`${photo.name}: ${error instanceof Error ? error.message : 'not saved'}`);
        }
        setBatchProgress({ done: i + 1, total: toSave.length });
      }
      await drop.mutate();
      setSaveMessage(
        failures.length
          ? { kind: 'error', text: `Saved ${toSave.length - failures.length} of ${toSave.length}. Not saved: ${failures.join('; ')}` }
          : { kind: 'ok', text: `Saved ${toSave.length} drop${toSave.length === 1 ? '' : 's'}.` },
      );
    } catch (error) {
      setSaveMessage({ kind: 'error', text: error instanceof Error ? error.message : 'Saving failed.' });
    } finally {
      setSaving(false);
      setBatchProgress(null);
    }
  }

  const analysedCount = photos.filter((p) => p.status === 'ready' || p.status === 'failed').length;
  const liquid = props.liquids.find((l) => l.id === session.probeLiquidId);
  const samplesByCoating = useMemo(() => {
    const groups = new Map<string, SampleChoice[]>();
    for (const s of props.samples) {
      const key = `${s.coatingCode} · ${s.coatingName}`;
      groups.set(key, [...(groups.get(key) ?? []), s]);
    }
    return [...groups];
  }, [props.samples]);

  return (
    <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_22rem]">
      <div className="min-w-0">
        <PhotoDropZone onUploaded={(photo) => addPhotos([photo])} />
        {photos.length > 0 ? (
          <>
            <div className="mb-2 flex items-center gap-3 text-sm text-ink-600">
              <span>
                {analysedCount} of {photos.length} analysed
              </span>
              <progress className="h-2 flex-1 accent-lagoon-600" max={photos.length} value={analysedCount} aria-label="Photos analysed" />
            </div>
            <ul className="mb-4 flex gap-2 overflow-x-auto pb-2" aria-label="Photos">
              {photos.map((photo) => (
                <li key={photo.id}>
                  <button
                    type="button"
                    onClick={() => select(photo.id)}
                    aria-pressed={photo.id === selected?.id}
                    className={`relative block w-28 shrink-0 overflow-hidden rounded-md border-2 text-left ${
                      photo.id === selected?.id ? 'border-lagoon-600' : 'border-transparent'
                    }`}
                  >
                    {/* eslint-disable-next-line @next/next/no-img-element -- authenticated thumbnail from our own route */}
                    <img src={`/api/photos/${photo.id}/thumbnail`} alt="" className="h-20 w-28 object-cover" />
                    <span className="block truncate bg-white px-1 text-xs text-ink-800">{photo.name}</span>
                    <StatusBadge photo={photo} />
                  </button>
                </li>
              ))}
            </ul>
            {selected ? (
              <>
                {picking ? (
                  <p className="mb-2 rounded-md bg-amber-50 px-3 py-2 text-sm text-amber-900">
                    Click the left and then the right outer edge of the needle ({picking.length} of 2 picked).{' '}
                    <button type="button" className="underline" onClick={() => setPicking(null)}>
                      Cancel
                    </button>
                  </p>
                ) : null}
                <DropCanvas
                  photoId={selected.id}
                  imageUrl={`/api/photos/${selected.id}/image`}
                  width={selected.width}
                  height={selected.height}
                  result={selected.result}
                  baseline={selected.baseline}
                  selectedHandle={selectedHandle}
                  onSelectHandle={setHandle}
                  onBaselineChange={(baseline) => setBaseline(selected.id, baseline)}
                  onPickPoint={picking ? (point) => setPicking([...picking, point]) : undefined}
                  pickedPoints={picking ?? undefined}
                />
                <div className="mt-2 flex flex-wrap gap-2">
                  <button type="button" className="btn-quiet" disabled={!selected.baseline} onClick={() => setBaseline(selected.id, null)}>
                    Use the automatic baseline
                  </button>
                </div>
              </>
            ) : null}
          </>
        ) : (
          <p className="rounded-md bg-white px-4 py-6 text-center text-sm text-ink-600">
            Upload photos to start. Each one is analysed in your browser as soon as it arrives.
          </p>
        )}
      </div>

      <aside className="space-y-4" aria-label="Analysis">
        <section className="card">
          <label htmlFor="fit-method" className="field-label">
            Profile fit
          </label>
          <select id="fit-method" className="field-input" value={method} onChange={(e) => setMethod(e.target.value as FitMethod)}>
            {FIT_METHODS.map((m) => (
              <option key={m} value={m}>
                {METHOD_LABELS[m]}
              </option>
            ))}
          </select>
        </section>
        <ResultsPanel result={selected?.result ?? null} status={selected?.status ?? 'loading'} error={selected?.error ?? null} />
        <SessionPanel
          liquids={props.liquids}
          value={session}
          onChange={(next) => setSession({ ...next, sessionId: null })}
          onCalibrate={() => setPicking([])}
          picked={picking}
          onCalibrated={(scaleValue) => {
            setSession((s) => ({ ...s, scalePxPerMm: scaleValue.toFixed(2), sessionId: null }));
            setPicking(null);
          }}
        />
        {liquid?.hazardNote ? (
          <p className="rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-sm text-amber-900" role="note">
            <strong>{liquid.name}:</strong> {liquid.hazardNote}
          </p>
        ) : null}
        <section className="card space-y-3">
          <h2>Save to a sample</h2>
          <div>
            <label htmlFor="sample" className="field-label">
              Sample
            </label>
            <select id="sample" className="field-input" value={sampleId} onChange={(e) => setSampleId(e.target.value)}>
              <option value="">Choose a sample…</option>
              {samplesByCoating.map(([group, samples]) => (
                <optgroup key={group} label={group}>
                  {samples.map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.lotCode} / {s.label}
                    </option>
                  ))}
                </optgroup>
              ))}
            </select>
            {props.samples.length === 0 ? (
              <p className="mt-1 text-xs text-ink-500">No samples yet: add a coating, a batch and a sample first.</p>
            ) : null}
          </div>
          <div className="flex flex-wrap gap-2">
            <button type="button" className="btn-primary" disabled={!selected || selected.status !== 'ready' || saving} onClick={onSave}>
              {saving && !batchProgress ? 'Saving…' : 'Save this drop'}
            </button>
            <button
              type="button"
              className="btn-quiet"
              disabled={saving || !photos.some((p) => p.status === 'ready' && p.dirty)}
              onClick={onSaveAll}
            >
              Save all analysed
            </button>
          </div>
          {batchProgress ? (
            <progress className="h-2 w-full accent-lagoon-600" max={batchProgress.total} value={batchProgress.done} aria-label="Saving photos" />
          ) : null}
          {saveMessage ? (
            <p role="status" className={`text-sm ${saveMessage.kind === 'ok' ? 'text-leaf-700' : 'text-coral-700'}`}>
              {saveMessage.text}
            </p>
          ) : null}
        </section>
        <RevisionsPanel data={drop.data} error={drop.error as Error | undefined} />
      </aside>
    </div>
  );
}

function StatusBadge({ photo }: { photo: WorkspacePhoto }) {
  const label =
    photo.status === 'failed'
      ? 'No result'
      : photo.status !== 'ready'
        ? 'Analysing'
        : photo.savedRevision !== null && !photo.dirty
          ? `Saved r${photo.savedRevision}`
          : photo.result?.warnings.length
            ? 'Check'
            : 'Analysed';
  const tone =
    photo.status === 'failed'
      ? 'bg-coral-500'
      : photo.status !== 'ready'
        ? 'bg-ink-400'
        : photo.savedRevision !== null && !photo.dirty
          ? 'bg-leaf-500'
          : photo.result?.warnings.length
            ? 'bg-amber-500'
            : 'bg-lagoon-600';
  return <span className={`absolute right-1 top-1 rounded px-1 text-[10px] font-medium text-white ${tone}`}>{label}</span>;
}

function RevisionsPanel({ data, error }: { data: DropResponse | undefined; error: Error | undefined }) {
  if (error) return <p className="text-sm text-coral-700">{error.message}</p>;
  const drop = data?.drop;
  if (!drop) return null;
  return (
    <section className="card" aria-label="Saved revisions">
      <h2 className="mb-1">Saved revisions</h2>
      <p className="mb-2 text-xs text-ink-500">
        {drop.coatingCode} · {drop.lotCode} / {drop.sampleLabel}. Every save is kept.
      </p>
      <table className="w-full text-sm">
        <thead className="text-xs text-ink-500">
          <tr>
            <th scope="col" className="text-left font-medium">Rev.</th>
            <th scope="col" className="text-left font-medium">Method</th>
            <th scope="col" className="text-right font-medium">Left</th>
            <th scope="col" className="text-right font-medium">Right</th>
          </tr>
        </thead>
        <tbody data-testid="revisions">
          {drop.revisions.map((r) => (
            <tr key={r.id} className="border-t border-ink-100">
              <td className="py-1">r{r.revision}</td>
              <td className="py-1 text-xs">{r.method}{r.baseline ? ' · hand baseline' : ''}</td>
              <td className="py-1 text-right font-mono">{r.leftDeg.toFixed(1)}°</td>
              <td className="py-1 text-right font-mono">{r.rightDeg.toFixed(1)}°</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
