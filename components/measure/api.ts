'use client';

import type { ErrorBody } from '@/lib/contracts/errors';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ErrorBody | null,
  ) {
    super(body?.error.message ?? `The server answered ${status}. Try again.`);
  }
}

/** fetch + JSON with Beadline's error body turned into an ApiError carrying the server's message. */
export async function apiFetch<T>(url: string, init: RequestInit & { json?: unknown } = {}): Promise<T> {
  const { json, ...rest } = init;
  const response = await fetch(url, {
    ...rest,
    headers: { ...(json !== undefined ? { 'content-type': 'application/json' } : {}), ...rest.headers },
    body: json !== undefined ? JSON.stringify(json) : rest.body,
  });
  const body = (await response.json().catch(() => null)) as unknown;
  if (!response.ok) throw new ApiError(response.status, body as ErrorBody | null);
  return body as T;
}

export const swrFetcher = <T,>(url: string) => apiFetch<T>(url);
