'use client';

import type { KeyboardEvent } from 'react';
import { liquidName, sampleName } from './sample-select';
import type { WorkspacePhoto } from './store';
import type { LiquidChoice, SampleChoice } from './types';

/**
 * What a photo's state says: analysing, failed, where it is in a save (waiting, saving, the
 * server busy, not saved), needs a look, analysed, saved or changed.
 */
export function photoBadge(photo: WorkspacePhoto): { label: string; tone: string } {
  if (photo.status === 'failed') return { label: 'No result', tone: 'bg-coral-700' };
  // A saved drop is badged saved at once, while the browser redraws its analysis after a reload.
  if (photo.status !== 'ready' && photo.savedRevision !== null && !photo.dirty)
    return { label: `Saved r${photo.savedRevision}`, tone: 'bg-leaf-700' };
  if (photo.status !== 'ready') return { label: 'Analysing', tone: 'bg-ink-600' };
  const save = photo.saveState;
  if (save?.step === 'queued') return { label: 'Waiting to save', tone: 'bg-ink-600' };
  if (save?.step === 'saving') return { label: 'Saving…', tone: 'bg-lagoon-700' };
  if (save?.step === 'retrying')
    return { label: `Server busy: retry in ${save.seconds} s`, tone: 'bg-amber-700' };
  if (save?.step === 'failed') return { label: 'Not saved', tone: 'bg-coral-700' };
  if (photo.savedRevision !== null && !photo.dirty)
    return { label: `Saved r${photo.savedRevision}`, tone: 'bg-leaf-700' };
  if (photo.savedRevision !== null)
    return { label: `Changed since r${photo.savedRevision}`, tone: 'bg-amber-700' };
  if (photo.result?.warnings.length) return { label: 'Check', tone: 'bg-amber-700' };
  return { label: 'Analysed', tone: 'bg-lagoon-700' };
}

const deg = (value: number | undefined) =>
  value === undefined || !Number.isFinite(value) ? '—' : `${value.toFixed(1)}°`;

const METHOD_SHORT: Record<string, string> = {
  'young-laplace': 'Young–Laplace',
  circle: 'Circle',
  polynomial: 'Polynomial',
  ellipse: 'Ellipse',
  'height-width': 'θ/2',
};

/**
 * The workspace's photos as a table: file, sample, liquid, method, angles, warnings and state.
 * A row's file name shows it on the canvas; ↑/↓ (or k/j) in the table show the previous/next.
 */
export function PhotoTable({
  photos,
  samples,
  liquids,
  selectedId,
  checked,
  onSelect,
  onStep,
  onToggle,
  onToggleAll,
  onRemove,
}: {
  photos: WorkspacePhoto[];
  samples: SampleChoice[];
  liquids: LiquidChoice[];
  selectedId: string | null;
  checked: string[];
  onSelect(id: string): void;
  onStep(by: -1 | 1): void;
  onToggle(id: string): void;
  onToggleAll(on: boolean): void;
  onRemove(photo: WorkspacePhoto): void;
}) {
  const allChecked = photos.length > 0 && photos.every((p) => checked.includes(p.id));
  function onKeyDown(event: KeyboardEvent) {
    if ((event.target as HTMLElement).tagName === 'INPUT') return;
    const by = { ArrowUp: -1, k: -1, ArrowDown: 1, j: 1 }[event.key] as -1 | 1 | undefined;
    if (!by) return;
    event.preventDefault();
    onStep(by);
  }
  return (
    <div
      className="max-h-[36rem] overflow-auto rounded-md border border-ink-200 bg-white"
      tabIndex={0}
      onKeyDown={onKeyDown}
      role="region"
      aria-label="Photos table: up and down arrow keys show the previous or next photo"
    >
      <table className="w-full text-xs" aria-label="Photos">
        <thead className="sticky top-0 bg-ink-50 text-left text-ink-700">
          <tr>
            <th className="px-1.5 py-1">
              <input
                type="checkbox"
                aria-label="Select all photos shown"
                checked={allChecked}
                onChange={(e) => onToggleAll(e.target.checked)}
              />
            </th>
            <th className="px-1.5 py-1">File</th>
            <th className="px-1.5 py-1">Sample</th>
            <th className="px-1.5 py-1">Liquid</th>
            <th className="px-1.5 py-1">Method</th>
            <th className="px-1.5 py-1 text-right">Left</th>
            <th className="px-1.5 py-1 text-right">Right</th>
            <th className="px-1.5 py-1 text-right">Mean</th>
            <th className="px-1.5 py-1 text-right">±</th>
            <th className="px-1.5 py-1">Warnings</th>
            <th className="px-1.5 py-1">State</th>
            <th className="px-1.5 py-1">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {photos.map((photo) => {
            const r = photo.status === 'ready' ? photo.result : null;
            const badge = photoBadge(photo);
            const current = photo.id === selectedId;
            const warnings = r?.warnings ?? [];
            return (
              <tr
                key={photo.id}
                data-photo-id={photo.id}
                aria-current={current ? 'true' : undefined}
                className={`border-t border-ink-100 ${current ? 'bg-lagoon-50' : ''}`}
              >
                <td className="px-1.5 py-1">
                  <input
                    type="checkbox"
                    aria-label={`Select ${photo.name}`}
                    checked={checked.includes(photo.id)}
                    onChange={() => onToggle(photo.id)}
                  />
                </td>
                <td className="max-w-[11rem] px-1.5 py-1">
                  <button
                    type="button"
                    className="flex max-w-full items-center gap-2 text-left font-medium text-lagoon-800 underline-offset-2 hover:underline"
                    aria-pressed={current}
                    title={photo.name}
                    onClick={() => onSelect(photo.id)}
                  >
                    {/* eslint-disable-next-line @next/next/no-img-element -- authenticated thumbnail from our own route */}
                    <img
                      src={`/api/photos/${photo.id}/thumbnail`}
                      alt=""
                      className="h-5 w-7 shrink-0 rounded-sm object-cover"
                    />
                    <span className="truncate">{photo.name}</span>
                  </button>
                </td>
                <td className="whitespace-nowrap px-1.5 py-1">
                  {sampleName(samples, photo.sampleId)}
                </td>
                <td className="whitespace-nowrap px-1.5 py-1">
                  {liquidName(liquids, photo.probeLiquidId)}
                </td>
                <td className="whitespace-nowrap px-1.5 py-1">
                  {METHOD_SHORT[photo.method] ?? photo.method}
                </td>
                <td className="px-1.5 py-1 text-right font-mono" data-cell="left">
                  {deg(r?.leftDeg)}
                </td>
                <td className="px-1.5 py-1 text-right font-mono" data-cell="right">
                  {deg(r?.rightDeg)}
                </td>
                <td className="px-1.5 py-1 text-right font-mono" data-cell="mean">
                  {deg(r?.meanDeg)}
                </td>
                <td className="px-1.5 py-1 text-right font-mono">
                  {r ? deg((r.leftUncertaintyDeg + r.rightUncertaintyDeg) / 2) : '—'}
                </td>
                <td className="px-1.5 py-1" title={warnings.map((w) => w.message).join('\n')}>
                  {photo.status === 'failed' ? (
                    <span className="text-coral-700">{photo.error}</span>
                  ) : warnings.length ? (
                    <span className="text-amber-800">
                      {warnings.length} warning{warnings.length === 1 ? '' : 's'}
                    </span>
                  ) : r ? (
                    'none'
                  ) : (
                    '—'
                  )}
                </td>
                <td className="whitespace-nowrap px-1.5 py-1">
                  <span
                    className={`rounded px-1.5 py-0.5 font-medium text-white ${badge.tone}`}
                    data-testid="photo-state"
                    title={photo.saveState?.step === 'failed' ? photo.saveState.error : undefined}
                  >
                    {badge.label}
                  </span>
                </td>
                <td className="px-1.5 py-1">
                  {photo.savedRevision === null ? (
                    <button
                      type="button"
                      className="text-ink-600 underline"
                      aria-label={`Remove ${photo.name}`}
                      onClick={() => onRemove(photo)}
                    >
                      Remove
                    </button>
                  ) : null}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
