'use client';

import { useState } from 'react';
import type { PhaseWindow } from '@/lib/dynamic/types';
import { defaultWindow, moveEdge, shiftWindow, type SeriesSpan } from './windows';

/**
 * One movable time window: its two ends as number fields (seconds) and buttons that shift the
 * whole window by one frame. `window` null: no such window; the user may add one.
 */
export function WindowControls({
  name,
  window,
  span,
  stepSec,
  detected,
  onChange,
}: {
  name: string;
  window: PhaseWindow | null;
  span: SeriesSpan;
  /** One frame's time (s): the step of the fields and the shift buttons. */
  stepSec: number;
  /** True while the window is the detected one (not moved by the user). */
  detected: boolean;
  onChange(window: PhaseWindow | null): void;
}) {
  const id = `window-${name.replace(/\W+/g, '-').toLowerCase()}`;
  if (!window)
    return (
      <fieldset className="rounded-md border border-ink-200 p-3" aria-labelledby={`${id}-legend`}>
        <legend id={`${id}-legend`} className="px-1 text-sm font-medium text-ink-900">
          {name} window
        </legend>
        <p className="text-sm text-ink-700">
          None. <button type="button" className="btn-quiet" onClick={() => onChange(defaultWindow(span))}>
            Add a {name.toLowerCase()} window
          </button>
        </p>
      </fieldset>
    );
  const digits = stepSec < 0.01 ? 4 : stepSec < 0.1 ? 3 : 2;
  const edge = (which: 'from' | 'to', label: string) => (
    <EdgeField
      id={`${id}-${which}`}
      label={label}
      value={Number((which === 'from' ? window.fromSec : window.toSec).toFixed(digits))}
      stepSec={stepSec}
      span={span}
      onCommit={(value) => onChange(moveEdge(window, which, value, span))}
    />
  );
  return (
    <fieldset className="rounded-md border border-ink-200 p-3" aria-labelledby={`${id}-legend`}>
      <legend id={`${id}-legend`} className="px-1 text-sm font-medium text-ink-900">
        {name} window {detected ? <span className="font-normal text-ink-600">(detected)</span> : null}
      </legend>
      <div className="flex flex-wrap items-end gap-3">
        {edge('from', 'From (s)')}
        {edge('to', 'To (s)')}
        <div className="flex gap-1" role="group" aria-label={`Shift the ${name.toLowerCase()} window`}>
          <button
            type="button"
            className="btn-quiet"
            aria-label={`Shift the ${name.toLowerCase()} window one frame earlier`}
            onClick={() => onChange(shiftWindow(window, -stepSec, span))}
          >
            ◀
          </button>
          <button
            type="button"
            className="btn-quiet"
            aria-label={`Shift the ${name.toLowerCase()} window one frame later`}
            onClick={() => onChange(shiftWindow(window, stepSec, span))}
          >
            ▶
          </button>
        </div>
        <button type="button" className="btn-quiet" onClick={() => onChange(null)}>
          Remove
        </button>
      </div>
    </fieldset>
  );
}

/**
 * A window end in seconds. What is typed is kept as typed and applied on Enter or when the field
 * is left, so a half-typed number never moves the window.
 */
function EdgeField({
  id,
  label,
  value,
  stepSec,
  span,
  onCommit,
}: {
  id: string;
  label: string;
  value: number;
  stepSec: number;
  span: SeriesSpan;
  onCommit(value: number): void;
}) {
  const [draft, setDraft] = useState<string | null>(null);
  const commit = () => {
    if (draft === null) return;
    const typed = Number(draft);
    setDraft(null);
    if (draft.trim() !== '' && Number.isFinite(typed)) onCommit(typed);
  };
  return (
    <label className="flex flex-col text-xs text-ink-700" htmlFor={id}>
      {label}
      <input
        id={id}
        type="number"
        inputMode="decimal"
        className="field-input w-28 font-mono"
        step={stepSec}
        min={span.startSec}
        max={span.endSec}
        value={draft ?? value}
        onChange={(event) => setDraft(event.target.value)}
        onBlur={commit}
        onKeyDown={(event) => {
          if (event.key === 'Enter') commit();
        }}
      />
    </label>
  );
}
