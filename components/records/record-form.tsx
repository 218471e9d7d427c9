'use client';

import type { ReactNode } from 'react';
import type { Conflict } from '@/components/data/use-mutation';
import { FormNotice } from '@/components/ui/fields';

export type Notice = { tone: 'error' | 'success'; text: string };

export type RecordFormProps = {
  noun: string;
  editing: boolean;
  onSubmit: (event?: React.BaseSyntheticEvent) => Promise<void>;
  submitting: boolean;
  labels: Record<string, string>;
  conflict: Conflict | null;
  onReapply: () => void;
  notice: Notice | null;
  children: ReactNode;
};

/** The frame of every record form: its name, the server's answer, the fields, the button. */
export function RecordForm({
  noun,
  editing,
  onSubmit,
  submitting,
  labels,
  conflict,
  onReapply,
  notice,
  children,
}: RecordFormProps) {
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="space-y-3"
      aria-label={`${editing ? 'Edit' : 'New'} ${noun}`}
    >
      {conflict ? (
        <ConflictNotice conflict={conflict} labels={labels} onReapply={onReapply} />
      ) : null}
      {notice ? <FormNotice tone={notice.tone}>{notice.text}</FormNotice> : null}
      {children}
      <button type="submit" className="btn-primary" disabled={submitting}>
        {editing ? `Save ${noun}` : `Add ${noun}`}
      </button>
    </form>
  );
}

/** Shows the record as it is now (after someone else's change) next to the user's edits. */
export function ConflictNotice({
  conflict,
  labels,
  onReapply,
}: {
  conflict: Conflict;
  labels: Record<string, string>;
  onReapply: () => void;
}) {
  const show = (key: string, value: unknown): string => {
    if (value === null || value === undefined || value === '') return '—';
    if (typeof value === 'object') {
      return (
        Object.entries(value as Record<string, unknown>)
          .map(([inner, v]) => `${labels[`${key}.${inner}`] ?? inner}: ${String(v)}`)
          .join(', ') || '—'
      );
    }
    return String(value);
  };
  return (
    <FormNotice tone="warning">
      <p className="font-medium">{conflict.message}</p>
      <p className="mt-1">Its current values are below. Your changes are still in the form.</p>
      <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1" data-testid="conflict-current">
        {Object.entries(labels)
          .filter(([key]) => !key.includes('.'))
          .map(([key, label]) => (
            <div key={key} className="contents">
              <dt className="text-ink-600">{label}</dt>
              <dd>{show(key, conflict.current[key])}</dd>
            </div>
          ))}
      </dl>
      <button type="button" className="btn-quiet mt-3" onClick={onReapply}>
        Apply my changes to the current version
      </button>
    </FormNotice>
  );
}
