'use client';

import { useState } from 'react';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { TextAreaField, useFieldState } from '@/components/ui/fields';
import { LiquidSelect, liquidName, SampleSelect, sampleName } from './sample-select';
import type { WorkspacePhoto } from './store';
import type { LiquidChoice, SampleChoice } from './types';
import { saveProblem } from './use-save-drops';

type Asking = { kind: 'save' } | { kind: 'remove'; photos: WorkspacePhoto[]; what: string } | null;

/**
 * What can be done with the ticked photos: put them on a sample and liquid, save them after a
 * confirmation that lists what goes where (with the reason when a saved drop is saved again),
 * or remove them; and remove every unsaved photo.
 */
export function SelectionBar({
  photos,
  ticked,
  samples,
  liquids,
  saving,
  onAssign,
  onSave,
  onRemove,
}: {
  photos: WorkspacePhoto[];
  ticked: WorkspacePhoto[];
  samples: SampleChoice[];
  liquids: LiquidChoice[];
  saving: boolean;
  onAssign(to: { sampleId?: string; probeLiquidId?: string }): void;
  onSave(photos: WorkspacePhoto[], reason: string): void;
  onRemove(photos: WorkspacePhoto[]): void;
}) {
  const [sampleId, , sampleField] = useFieldState('');
  const [liquidId, , liquidField] = useFieldState('');
  const [asking, setAsking] = useState<Asking>(null);
  const [reason, , reasonField] = useFieldState('');
  const resaves = ticked.filter((p) => p.savedRevision !== null);
  const problems = ticked.map((p) => saveProblem(p, reason)).filter(Boolean);
  const unsavedTicked = ticked.filter((p) => p.savedRevision === null);
  const unsaved = photos.filter((p) => p.savedRevision === null);
  const n = ticked.length;

  return (
    <section className="mb-3 space-y-2 rounded-md bg-ink-50 p-2 text-sm" aria-label="Ticked photos">
      <div className="flex flex-wrap items-end gap-2">
        <p className="mr-2 self-center font-medium text-ink-800" role="status">
          {n} ticked
        </p>
        <SampleSelect
          id="assign-sample"
          label="Put ticked on sample"
          placeholder="Keep their samples"
          samples={samples}
          {...sampleField}
        />
        <LiquidSelect
          id="assign-liquid"
          label="Probe liquid of ticked"
          placeholder="Keep their liquids"
          liquids={liquids}
          {...liquidField}
        />
        <button
          type="button"
          className="btn-quiet"
          disabled={n === 0 || (!sampleId && !liquidId)}
          onClick={() =>
            onAssign({
              ...(sampleId ? { sampleId } : {}),
              ...(liquidId ? { probeLiquidId: liquidId } : {}),
            })
          }
        >
          Assign to {n} ticked
        </button>
      </div>
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="btn-primary"
          disabled={n === 0 || saving}
          onClick={() => setAsking({ kind: 'save' })}
        >
          Save {n} ticked…
        </button>
        <button
          type="button"
          className="btn-quiet"
          disabled={unsavedTicked.length === 0}
          onClick={() => setAsking({ kind: 'remove', photos: unsavedTicked, what: 'ticked' })}
        >
          Remove ticked
        </button>
        <button
          type="button"
          className="btn-quiet"
          disabled={unsaved.length === 0}
          onClick={() => setAsking({ kind: 'remove', photos: unsaved, what: 'unsaved' })}
        >
          Remove all unsaved
        </button>
      </div>

      <ConfirmDialog
        open={asking?.kind === 'save'}
        title={`Save ${n} drop${n === 1 ? '' : 's'}?`}
        confirmLabel={`Save ${n} drop${n === 1 ? '' : 's'}`}
        confirmDisabled={problems.length > 0}
        onCancel={() => setAsking(null)}
        onConfirm={() => {
          setAsking(null);
          onSave(ticked, reason);
        }}
      >
        <table className="w-full text-xs" aria-label="What goes where">
          <thead className="text-left text-ink-600">
            <tr>
              <th className="py-1 pr-2">File</th>
              <th className="py-1 pr-2">Sample</th>
              <th className="py-1 pr-2">Liquid</th>
              <th className="py-1">Saves as</th>
            </tr>
          </thead>
          <tbody>
            {ticked.map((p) => (
              <tr key={p.id} className="border-t border-ink-100">
                <td className="break-all py-1 pr-2">{p.name}</td>
                <td className="py-1 pr-2">{sampleName(samples, p.sampleId)}</td>
                <td className="py-1 pr-2">{liquidName(liquids, p.probeLiquidId)}</td>
                <td className="py-1">
                  {p.savedRevision === null ? 'new drop' : `revision ${p.savedRevision + 1}`}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        {resaves.length > 0 ? (
          <TextAreaField
            id="save-reason"
            className="mt-3"
            label="Why are saved drops analysed again?"
            hint="Kept with each new revision."
            {...reasonField}
          />
        ) : null}
        {problems.length > 0 ? (
          <ul className="mt-3 list-disc pl-5 text-coral-700" aria-label="Before saving">
            {[...new Set(problems)].map((problem) => (
              <li key={problem}>{problem}</li>
            ))}
          </ul>
        ) : null}
      </ConfirmDialog>

      <ConfirmDialog
        open={asking?.kind === 'remove'}
        title={`Remove ${asking?.kind === 'remove' ? asking.photos.length : 0} ${asking?.kind === 'remove' ? asking.what : ''} photo(s)?`}
        confirmLabel="Remove"
        onCancel={() => setAsking(null)}
        onConfirm={() => {
          if (asking?.kind === 'remove') onRemove(asking.photos);
          setAsking(null);
        }}
      >
        <p>They leave the workspace; uploading the same file again brings a photo back.</p>
        <ul className="mt-2 list-disc pl-5">
          {(asking?.kind === 'remove' ? asking.photos : []).map((p) => (
            <li key={p.id} className="break-all">
              {p.name}
            </li>
          ))}
        </ul>
      </ConfirmDialog>
    </section>
  );
}
