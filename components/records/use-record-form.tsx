'use client';

import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, type DefaultValues, type FieldValues } from 'react-hook-form';
import type { z } from 'zod';
import { FormNotice } from '@/components/ui/form-field';
import { applyServerErrors, RecordApiError, sendJson } from './api';

export type Conflict = { current: Record<string, unknown>; message: string };

/**
 * A record form: react-hook-form validated by the shared zod schema, sent to the REST API,
 * with the server's field errors put on the fields and a 409 stale_version turned into a
 * conflict notice that keeps what was typed and lets the user apply it over the current record.
 */
export function useRecordForm<V extends FieldValues>(options: {
  schema: z.ZodType;
  defaultValues: DefaultValues<V>;
  fields: readonly string[];
  url: string;
  method: 'POST' | 'PATCH';
  /** Body to send from the parsed values (defaults to the values themselves). */
  toBody?: (values: FieldValues) => unknown;
  onSaved?: (body: Record<string, unknown>) => void;
}) {
  const router = useRouter();
  const form = useForm<V>({
    // The schemas' input (form text) and output (parsed values) types differ from V on purpose.
    resolver: zodResolver(options.schema as never) as never,
    defaultValues: options.defaultValues,
  });
  const [notice, setNotice] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const [conflict, setConflict] = useState<Conflict | null>(null);

  const onSubmit = form.handleSubmit(async (values) => {
    setNotice(null);
    try {
      const body = await sendJson<Record<string, unknown>>(
        options.url,
        options.method,
        options.toBody ? options.toBody(values) : values,
      );
      setConflict(null);
      setNotice({ tone: 'success', text: 'Saved.' });
      // The next edit starts from the version just saved.
      const saved = Object.values(body).find(
        (value): value is { version: number } =>
          typeof value === 'object' &&
          value !== null &&
          typeof (value as { version?: unknown }).version === 'number',
      );
      if (options.method === 'PATCH' && saved)
        form.setValue('version' as never, saved.version as never);
      options.onSaved?.(body);
      router.refresh();
    } catch (error) {
      if (!(error instanceof RecordApiError)) throw error;
      if (error.code === 'stale_version' && error.body?.current) {
        setConflict({
          current: error.body.current as Record<string, unknown>,
          message: 'Someone changed this record while you were editing.',
        });
        return;
      }
      const rest = applyServerErrors(form, error, options.fields);
      if (rest) setNotice({ tone: 'error', text: rest });
    }
  });

  /** Keeps every typed value and takes the current version, so the next save applies them. */
  const reapply = () => {
    if (!conflict) return;
    form.setValue('version' as never, conflict.current.version as never);
    setConflict(null);
    setNotice(null);
  };

  return { form, onSubmit, notice, conflict, reapply, setNotice };
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
  const show = (value: unknown): string => {
    if (value === null || value === undefined || value === '') return '—';
    if (typeof value === 'object') {
      return (
        Object.entries(value as Record<string, unknown>)
          .map(([key, inner]) => `${labels[`${'process.'}${key}`] ?? key}: ${String(inner)}`)
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
              <dd>{show(conflict.current[key])}</dd>
            </div>
          ))}
      </dl>
      <button type="button" className="btn-quiet mt-3" onClick={onReapply}>
        Apply my changes to the current version
      </button>
    </FormNotice>
  );
}

export function FormMessages({
  notice,
  conflict,
  labels,
  onReapply,
}: {
  notice: { tone: 'error' | 'success'; text: string } | null;
  conflict: Conflict | null;
  labels: Record<string, string>;
  onReapply: () => void;
}) {
  return (
    <>
      {conflict ? (
        <ConflictNotice conflict={conflict} labels={labels} onReapply={onReapply} />
      ) : null}
      {notice ? <FormNotice tone={notice.tone}>{notice.text}</FormNotice> : null}
    </>
  );
}
