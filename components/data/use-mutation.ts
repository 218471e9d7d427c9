'use client';

import { useRef, useState } from 'react';
import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';
import { ApiError } from './api-error';
import { apiFetch, type ApiRequest } from './fetch';

/** A 409 stale_version: the record as it is now, after someone else's change. */
export type Conflict = { current: Record<string, unknown>; message: string };

export type MutationResult<T> = { ok: true; data: T } | { ok: false; error: ApiError };

type State = {
  pending: boolean;
  error: ApiError | null;
  /** The error's text when it is not already shown on the fields; null otherwise. */
  message: string | null;
  /** Every field error of the last answer, for forms that are not react-hook-form forms. */
  fieldErrors: Record<string, string>;
  conflict: Conflict | null;
};

const IDLE: State = { pending: false, error: null, message: null, fieldErrors: {}, conflict: null };

export const CONFLICT_MESSAGE = 'Someone changed this record while you were editing.';

/**
 * The client's one mutation hook: sends a request through `apiFetch` and keeps its pending
 * state and its error. The server's field errors go onto the react-hook-form fields they name
 * (`form`, limited to `fields` when given); a 409 `stale_version` that carries `current` becomes
 * a `conflict` that keeps what was typed; a network failure says nothing was lost.
 */
export function useMutation<TReply = unknown, V extends FieldValues = FieldValues>(
  options: {
    form?: UseFormReturn<V>;
    /** The field names this form shows (a nested name counts under its first part). */
    fields?: readonly string[];
  } = {},
) {
  const [state, setState] = useState<State>(IDLE);
  const inFlight = useRef(0);
  const latest = useRef(0);

  async function run(
    url: string,
    request: Omit<ApiRequest, 'signal'> = { method: 'POST' },
  ): Promise<MutationResult<TReply>> {
    const call = ++latest.current;
    inFlight.current += 1;
    setState((s) => ({ ...s, pending: true, error: null, message: null }));
    try {
      const data = await apiFetch<TReply>(url, request);
      if (call === latest.current) setState({ ...IDLE, pending: inFlight.current > 1 });
      return { ok: true, data };
    } catch (caught) {
      if (!(caught instanceof ApiError)) throw caught;
      if (call === latest.current) setState(failedState(caught, options, inFlight.current > 1));
      return { ok: false, error: caught };
    } finally {
      inFlight.current -= 1;
      if (inFlight.current === 0) setState((s) => (s.pending ? { ...s, pending: false } : s));
    }
  }

  /** Takes the current version so the next save applies what was typed over it. */
  function resolveConflict() {
    if (state.conflict && options.form)
      options.form.setValue('version' as Path<V>, state.conflict.current.version as never);
    setState((s) => ({ ...s, conflict: null, message: null, error: null }));
  }

  const reset = () => setState(IDLE);

  return { ...state, run, resolveConflict, reset };
}

function failedState<V extends FieldValues>(
  error: ApiError,
  options: { form?: UseFormReturn<V>; fields?: readonly string[] },
  pending: boolean,
): State {
  const { form } = options;
  const current = error.extra.current;
  if (error.code === 'stale_version' && typeof current === 'object' && current !== null) {
    return {
      pending,
      error,
      // A form shows the conflict beside what was typed; elsewhere the message says it.
      message: form ? null : error.message,
      fieldErrors: {},
      conflict: { current: current as Record<string, unknown>, message: CONFLICT_MESSAGE },
    };
  }
  const known = options.fields ?? (form ? Object.keys(form.getValues()) : []);
  const isShown = (key: string) => known.includes(key) || known.includes(key.split('.')[0]);
  const entries = Object.entries(error.fields);
  for (const [key, message] of entries)
    if (form && isShown(key)) form.setError(key as Path<V>, { type: 'server', message });
  // The summary line adds nothing when every problem is shown on its field.
  const redundant =
    entries.length > 0 &&
    entries.every(([key]) => isShown(key)) &&
    (error.code === 'invalid_input' || entries.some(([, message]) => message === error.message));
  return {
    pending,
    error,
    message: redundant ? null : error.message,
    fieldErrors: { ...error.fields },
    conflict: null,
  };
}
