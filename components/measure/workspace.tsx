'use client';

import { useState } from 'react';
import { usePhotoDrop } from '@/components/data/resources';
import { SelectField } from '@/components/ui/fields';
import { FIT_METHODS, type FitMethod, type Point } from '@/lib/analysis/types';
import { PhotoStage } from './photo-stage';
import { PhotoStrip } from './photo-strip';
import { ResultsPanel } from './results-panel';
import { RevisionsPanel } from './revisions-panel';
import { SavePanel } from './save-panel';
import { SessionPanel } from './session-panel';
import { useSelectedPhoto, useWorkspace } from './store';
import { initialSession, scaleOf, type LiquidChoice, type SampleChoice } from './types';
import { PhotoDropZone, type UploadedPhoto } from './uploads';
import { useAutoAnalysis, useStripInAddress } from './use-auto-analysis';
import { useSaveDrops } from './use-save-drops';

export type { LiquidChoice, SampleChoice };

const METHOD_CHOICES: { value: FitMethod; label: string }[] = FIT_METHODS.map((m) => ({
  value: m,
  label: {
    'young-laplace': 'Young–Laplace (gravity-deformed drop)',
    circle: 'Circle (spherical cap)',
    polynomial: 'Polynomial tangent',
    ellipse: 'Ellipse',
    'height-width': 'Height–width (θ/2)',
  }[m],
}));

/**
 * The measurement workspace: photos are uploaded, analysed in the browser, checked and
 * adjusted on the canvas, then saved to a sample with the session's details.
 */
export function MeasureWorkspace(props: {
  samples: SampleChoice[];
  liquids: LiquidChoice[];
  initialPhotos: UploadedPhoto[];
  initialSampleId: string | null;
  operatorName: string;
}) {
  const { photos, method, addPhotos, select, setMethod, markSaved } = useWorkspace();
  const selected = useSelectedPhoto();
  const [sampleId, setSampleId] = useState(props.initialSampleId ?? '');
  const [session, setSession] = useState(() => initialSession(props.liquids, props.operatorName));
  const [picking, setPicking] = useState<Point[] | null>(null);

  useStripInAddress(props.initialPhotos);
  useAutoAnalysis(scaleOf(session));

  // A photo saved earlier opens with its saved sample and latest revision.
  const saved = usePhotoDrop(selected?.id ?? null, {
    onLoaded: (drop, photoId) => {
      const photo = useWorkspace.getState().photos.find((p) => p.id === photoId);
      if (drop && photo && photo.savedRevision === null) {
        setSampleId(drop.sampleId);
        markSaved(photo.id, drop.revisions[0]?.revision ?? 0);
      }
    },
  });
  const saving = useSaveDrops({
    sampleId,
    session,
    method,
    onSessionCreated: (sessionId) => setSession((s) => ({ ...s, sessionId })),
    onSaved: saved.reload,
  });
  const liquid = props.liquids.find((l) => l.id === session.probeLiquidId);

  return (
    <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_22rem]">
      <div className="min-w-0">
        <PhotoDropZone onUploaded={(photo) => addPhotos([photo])} />
        {photos.length > 0 ? (
          <>
            <PhotoStrip photos={photos} selectedId={selected?.id ?? null} onSelect={select} />
            {selected ? (
              <PhotoStage
                photo={selected}
                picking={picking}
                onPick={setPicking}
                onCancelPicking={() => setPicking(null)}
              />
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
          <SelectField
            id="fit-method"
            label="Profile fit"
            options={METHOD_CHOICES}
            value={method}
            onChange={(e) => setMethod(e.target.value as FitMethod)}
          />
        </section>
        <ResultsPanel
          result={selected?.result ?? null}
          status={selected?.status ?? 'loading'}
          error={selected?.error ?? null}
        />
        <SessionPanel
          liquids={props.liquids}
          value={session}
          onChange={(next) => setSession({ ...next, sessionId: null })}
          onCalibrate={() => setPicking([])}
          picked={picking}
          onCalibrated={(scale) => {
            setSession((s) => ({ ...s, scalePxPerMm: scale.toFixed(2), sessionId: null }));
            setPicking(null);
          }}
        />
        {liquid?.hazardNote ? (
          <p
            className="rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-sm text-amber-900"
            role="note"
          >
            <strong>{liquid.name}:</strong> {liquid.hazardNote}
          </p>
        ) : null}
        <SavePanel
          samples={props.samples}
          sampleId={sampleId}
          onSampleChange={setSampleId}
          canSaveOne={selected?.status === 'ready'}
          canSaveAll={photos.some((p) => p.status === 'ready' && p.dirty)}
          saving={saving.saving}
          progress={saving.progress}
          message={saving.message}
          onSaveOne={() => selected && void saving.saveOne(selected)}
          onSaveAll={() => void saving.saveAll(photos)}
          stale={saving.stale}
          onReload={(entry) => void saving.reloadCurrent(entry)}
        />
        <RevisionsPanel drop={saved.drop} error={saved.error} />
      </aside>
    </div>
  );
}
