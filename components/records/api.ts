'use client';

import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';
import type { ErrorBody, ErrorCode } from '@/lib/contracts/errors';

/** A non-2xx answer with Beadline's error body (and any extra keys, like `current` on 409). */
export class RecordApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: (ErrorBody<ErrorCode | 'network'> & Record<string, unknown>) | null,
  ) {
    super(body?.error.message ?? `The server answered ${status}. Try again.`);
  }
  get code(): string | undefined {
    return this.body?.error.code;
  }
}

export async function sendJson<T>(url: string, method: string, json?: unknown): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, {
      method,
      headers: json === undefined ? undefined : { 'content-type': 'application/json' },
      body: json === undefined ? undefined : JSON.stringify(json),
    });
  } catch {
    throw new RecordApiError(0, {
      error: {
        code: 'network',
        message:
          'The server could not be reached. Check the connection and try again; nothing was lost.',
      },
    });
  }
  const body = (await response.json().catch(() => null)) as unknown;
  if (!response.ok)
    throw new RecordApiError(response.status, body as ErrorBody & Record<string, unknown>);
  return body as T;
}

/** Puts the server's field errors (400/404/409 `fields`) on the form's fields; returns the rest. */
export function applyServerErrors<V extends FieldValues>(
  form: UseFormReturn<V>,
  error: RecordApiError,
  knownFields: readonly string[],
): string | null {
  const fields = error.body?.error.fields ?? {};
  let unplaced = false;
  for (const [key, message] of Object.entries(fields)) {
    if (knownFields.includes(key) || knownFields.includes(key.split('.')[0]))
      form.setError(key as Path<V>, { type: 'server', message });
    else unplaced = true;
  }
  if (Object.keys(fields).length === 0 || unplaced) return error.message;
  return null;
}
