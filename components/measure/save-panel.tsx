'use client';

import { TextAreaField, useFieldState } from '@/components/ui/fields';
import { LiquidSelect, SampleSelect } from './sample-select';
import type { WorkspacePhoto } from './store';
import type { LiquidChoice, SampleChoice } from './types';
import type { SaveMessage, StaleSave } from './use-save-drops';

/**
 * The shown photo's sample and probe liquid and its save button (with the reason when its drop
 * is saved already), and the outcome of the last save.
 */
export function SavePanel({
  photo,
  samples,
  liquids,
  onAssign,
  saving,
  progress,
  message,
  onSaveOne,
  stale = [],
  onReload,
}: {
  photo: WorkspacePhoto | null;
  samples: SampleChoice[];
  liquids: LiquidChoice[];
  onAssign(to: { sampleId?: string; probeLiquidId?: string }): void;
  saving: boolean;
  progress: { done: number; total: number } | null;
  message: SaveMessage | null;
  onSaveOne(reason: string): void;
  /** Saves refused because the drop was saved since it was loaded. */
  stale?: StaleSave[];
  onReload?: (entry: StaleSave) => void;
}) {
  const [reason, setReason, reasonField] = useFieldState('');
  const resave = photo?.savedRevision !== null && photo?.savedRevision !== undefined;
  return (
    <section className="card space-y-3" aria-label="Save the shown photo">
      <h2>Save to a sample</h2>
      <SampleSelect
        id="sample"
        label="Sample"
        placeholder="Choose a sample…"
        samples={samples}
        disabled={!photo}
        value={photo?.sampleId ?? ''}
        onChange={(e) => onAssign({ sampleId: e.target.value })}
      />
      <LiquidSelect
        id="photo-liquid"
        label="Probe liquid"
        placeholder="Choose the liquid…"
        disabled={!photo}
        liquids={liquids}
        value={photo?.probeLiquidId ?? ''}
        onChange={(e) => onAssign({ probeLiquidId: e.target.value })}
      />
      {resave ? (
        <TextAreaField
          id="resave-reason"
          label="Reason for the re-analysis"
          hint={`Revision ${photo.savedRevision} is saved; a new one keeps this reason.`}
          {...reasonField}
        />
      ) : null}
      <button
        type="button"
        className="btn-primary"
        disabled={photo?.status !== 'ready' || saving}
        onClick={() => {
          onSaveOne(reason);
          setReason('');
        }}
      >
        {saving && !progress ? 'Saving…' : 'Save this drop'}
      </button>
      {progress ? (
        <progress
          className="h-2 w-full accent-lagoon-600"
          max={progress.total}
          value={progress.done}
          aria-label="Saving photos"
        />
      ) : null}
      {message ? (
        <p
          role="status"
          className={`text-sm ${message.kind === 'ok' ? 'text-leaf-700' : 'text-coral-700'}`}
        >
          {message.text}
        </p>
      ) : null}
      {stale.map((entry) => (
        <div
          key={entry.photoId}
          role="alert"
          data-testid="stale-save"
          className="space-y-2 rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-sm text-amber-900"
        >
          <p>
            {entry.photoName} was saved as revision {entry.current} by another tab or person since
            you loaded it. Your analysis was not saved.
          </p>
          <button type="button" className="btn-quiet" onClick={() => onReload?.(entry)}>
            Reload revision {entry.current}
          </button>
        </div>
      ))}
    </section>
  );
}
