'use client';

import { useMemo } from 'react';
import { SelectField } from '@/components/ui/fields';
import type { SampleChoice } from './types';
import type { SaveMessage, StaleSave } from './use-save-drops';

/** Which sample the drops go to, and the save buttons with their progress and outcome. */
export function SavePanel({
  samples,
  sampleId,
  onSampleChange,
  canSaveOne,
  canSaveAll,
  saving,
  progress,
  message,
  onSaveOne,
  onSaveAll,
  stale = [],
  onReload,
}: {
  samples: SampleChoice[];
  sampleId: string;
  onSampleChange: (id: string) => void;
  canSaveOne: boolean;
  canSaveAll: boolean;
  saving: boolean;
  progress: { done: number; total: number } | null;
  message: SaveMessage | null;
  onSaveOne: () => void;
  onSaveAll: () => void;
  /** Saves refused because the drop was saved since it was loaded. */
  stale?: StaleSave[];
  onReload?: (entry: StaleSave) => void;
}) {
  return (
    <section className="card space-y-3">
      <h2>Save to a sample</h2>
      <SampleSelect id="sample" samples={samples} value={sampleId} onChange={onSampleChange} />
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="btn-primary"
          disabled={!canSaveOne || saving}
          onClick={onSaveOne}
        >
          {saving && !progress ? 'Saving…' : 'Save this drop'}
        </button>
        <button
          type="button"
          className="btn-quiet"
          disabled={saving || !canSaveAll}
          onClick={onSaveAll}
        >
          Save all analysed
        </button>
      </div>
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

/** The sample to save to, grouped by coating (also on the dynamic-wetting page). */
export function SampleSelect({
  id,
  samples,
  value,
  onChange,
}: {
  id: string;
  samples: SampleChoice[];
  value: string;
  onChange: (id: string) => void;
}) {
  const byCoating = useMemo(() => {
    const groups = new Map<string, SampleChoice[]>();
    for (const s of samples) {
      const key = `${s.coatingCode} · ${s.coatingName}`;
      groups.set(key, [...(groups.get(key) ?? []), s]);
    }
    return [...groups];
  }, [samples]);
  return (
    <SelectField
      id={id}
      label="Sample"
      placeholder="Choose a sample…"
      value={value}
      onChange={(e) => onChange(e.target.value)}
      hint={
        samples.length === 0 ? 'No samples yet: add a coating, a batch and a sample first.' : undefined
      }
    >
      {byCoating.map(([group, choices]) => (
        <optgroup key={group} label={group}>
          {choices.map((s) => (
            <option key={s.id} value={s.id}>
              {s.lotCode} / {s.label}
            </option>
          ))}
        </optgroup>
      ))}
    </SelectField>
  );
}
