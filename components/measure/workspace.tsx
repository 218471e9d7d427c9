'use client';

import { useEffect, useMemo, useState } from 'react';
import Link from 'next/link';
import { usePhotoDrop } from '@/components/data/resources';
import { CheckboxField, SelectField } from '@/components/ui/fields';
import { FIT_METHODS, type FitMethod, type Point } from '@/lib/analysis/types';
import type { WorkspaceSessionSeed } from '@/lib/contracts/photos';
import { dropHref } from '@/lib/measure/links';
import { PhotoStage } from './photo-stage';
import { PhotoTable } from './photo-table';
import { ResultsPanel } from './results-panel';
import { RevisionsPanel } from './revisions-panel';
import { SavePanel } from './save-panel';
import { SelectionBar } from './selection-bar';
import { SessionPanel } from './session-panel';
import { useSelectedPhoto, useWorkspace, type IncomingPhoto } from './store';
import { initialSession, scaleOf, type LiquidChoice, type SampleChoice } from './types';
import { PhotoDropZone } from './uploads';
import { useAutoAnalysis, useStripInAddress } from './use-auto-analysis';
import { useRemovePhotos } from './use-remove-photos';
import { useSaveDrops } from './use-save-drops';

export type { LiquidChoice, SampleChoice };

export const METHOD_LABELS: Record<FitMethod, string> = {
  'young-laplace': 'Young–Laplace (gravity-deformed drop)',
  circle: 'Circle (spherical cap)',
  polynomial: 'Polynomial tangent',
  ellipse: 'Ellipse',
  'height-width': 'Height–width (θ/2)',
};
const METHOD_CHOICES = FIT_METHODS.map((m) => ({ value: m, label: METHOD_LABELS[m] }));

/**
 * The measurement workspace: photos are uploaded, analysed in the browser in order and listed
 * in a table beside the canvas; each is checked and adjusted on the canvas, put on a sample and
 * liquid (one by one or as a selection) and saved with the session's details.
 */
export function MeasureWorkspace(props: {
  samples: SampleChoice[];
  liquids: LiquidChoice[];
  initialPhotos: IncomingPhoto[];
  initialSampleId: string | null;
  initialSession: WorkspaceSessionSeed | null;
  operatorName: string;
}) {
  const { photos, checked, method, addPhotos, select, step, setMethod, assign, setDefaults } =
    useWorkspace();
  const { setChecked, toggleChecked } = useWorkspace();
  const selected = useSelectedPhoto();
  const [session, setSession] = useState(() =>
    initialSession(props.liquids, props.operatorName, props.initialSession),
  );
  const [picking, setPicking] = useState<Point[] | null>(null);
  const [onlyWarnings, setOnlyWarnings] = useState(false);

  useEffect(() => {
    setDefaults({ sampleId: props.initialSampleId ?? '', probeLiquidId: session.probeLiquidId });
    // Once, before the first photos arrive.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);
  useStripInAddress(props.initialPhotos);
  useAutoAnalysis(scaleOf(session));

  const saved = usePhotoDrop(selected?.savedRevision !== null ? (selected?.id ?? null) : null);
  const saving = useSaveDrops({
    session,
    onSessionCreated: (sessionId) => setSession((s) => ({ ...s, sessionId })),
    onSaved: saved.reload,
  });
  const removing = useRemovePhotos();

  const shown = useMemo(
    () =>
      onlyWarnings
        ? photos.filter((p) => p.status === 'failed' || (p.result?.warnings.length ?? 0) > 0)
        : photos,
    [photos, onlyWarnings],
  );
  const stepShown = (by: -1 | 1) =>
    step(
      shown.map((p) => p.id),
      by,
    );
  const ticked = photos.filter((p) => checked.includes(p.id));
  const analysed = photos.filter((p) => p.status === 'ready' || p.status === 'failed').length;
  const liquid = props.liquids.find((l) => l.id === selected?.probeLiquidId);

  return (
    <div className="grid gap-6 2xl:grid-cols-[minmax(0,1fr)_22rem]">
      <div className="min-w-0">
        <PhotoDropZone onUploaded={(photo) => addPhotos([photo], { upload: true })} />
        <div className="mb-2 flex flex-wrap items-center gap-3 text-sm text-ink-700">
          <span>
            {analysed} of {photos.length} analysed
          </span>
          <progress
            className="h-2 w-40 accent-lagoon-600"
            max={Math.max(photos.length, 1)}
            value={analysed}
            aria-label="Photos analysed"
          />
          <CheckboxField
            id="only-warnings"
            label="Only photos with warnings"
            checked={onlyWarnings}
            onChange={(e) => setOnlyWarnings(e.target.checked)}
          />
          {(
            [
              [-1, '↑ Previous'],
              [1, '↓ Next'],
            ] as const
          ).map(([by, label]) => (
            <button key={by} type="button" className="btn-quiet" onClick={() => stepShown(by)}>
              {label}
            </button>
          ))}
        </div>
        {photos.length > 0 ? (
          <>
            <SelectionBar
              photos={photos}
              ticked={ticked}
              samples={props.samples}
              liquids={props.liquids}
              saving={saving.saving}
              onAssign={(to) => assign(checked, to)}
              onSave={(list, reason) => void saving.saveMany(list, reason)}
              onRemove={(list) => void removing.remove(list.map((p) => p.id))}
            />
            {removing.message ? (
              <p role="status" className="mb-2 text-sm text-ink-700">
                {removing.message}
              </p>
            ) : null}
            <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
              <PhotoTable
                photos={shown}
                samples={props.samples}
                liquids={props.liquids}
                selectedId={selected?.id ?? null}
                checked={checked}
                onSelect={select}
                onStep={stepShown}
                onToggle={toggleChecked}
                onToggleAll={(on) => setChecked(on ? shown.map((p) => p.id) : [])}
                onRemove={(photo) => void removing.remove([photo.id])}
              />
              <div className="min-w-0">
                {selected ? (
                  <>
                    <p
                      className="mb-1 break-all text-sm font-medium text-ink-900"
                      data-testid="shown-photo"
                    >
                      {selected.name}
                      {selected.dropId ? (
                        <>
                          {' · '}
                          <Link className="underline" href={dropHref(selected.dropId)}>
                            drop page
                          </Link>
                        </>
                      ) : null}
                    </p>
                    <PhotoStage
                      photo={selected}
                      picking={picking}
                      onPick={setPicking}
                      onCancelPicking={() => setPicking(null)}
                    />
                  </>
                ) : (
                  <p className="rounded-md bg-white px-4 py-6 text-center text-sm text-ink-600">
                    Choose a photo in the table.
                  </p>
                )}
              </div>
            </div>
          </>
        ) : (
          <p className="rounded-md bg-white px-4 py-6 text-center text-sm text-ink-600">
            Upload photos to start. Each one is analysed in your browser as soon as it arrives.
          </p>
        )}
      </div>

      <aside
        className="grid content-start gap-4 md:grid-cols-2 2xl:grid-cols-1"
        aria-label="Analysis"
      >
        <section className="card">
          <SelectField
            id="fit-method"
            label="Profile fit"
            hint="For the shown photo and new uploads."
            options={METHOD_CHOICES}
            value={selected?.method ?? method}
            onChange={(e) => setMethod(e.target.value as FitMethod)}
          />
        </section>
        <ResultsPanel
          result={selected?.result ?? null}
          status={selected?.status ?? null}
          error={selected?.error ?? null}
        />
        <SavePanel
          key={selected?.id ?? 'none'}
          photo={selected}
          samples={props.samples}
          liquids={props.liquids}
          onAssign={(to) => selected && assign([selected.id], to)}
          saving={saving.saving}
          progress={saving.progress}
          message={saving.message}
          onSaveOne={(reason) => selected && void saving.saveOne(selected, reason)}
          stale={saving.stale}
          onReload={(entry) => void saving.reloadCurrent(entry)}
        />
        {liquid?.hazardNote ? (
          <p
            className="rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-sm text-amber-900"
            role="note"
          >
            <strong>{liquid.name}:</strong> {liquid.hazardNote}
          </p>
        ) : null}
        <SessionPanel
          value={session}
          onChange={(next) => setSession({ ...next, sessionId: null })}
          onCalibrate={() => setPicking([])}
          picked={picking}
          onCalibrated={(scale) => {
            setSession((s) => ({ ...s, scalePxPerMm: scale.toFixed(2), sessionId: null }));
            setPicking(null);
          }}
        />
        <RevisionsPanel
          drop={selected?.savedRevision !== null ? saved.drop : null}
          error={saved.error}
        />
      </aside>
    </div>
  );
}
