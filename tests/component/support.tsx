import { render } from '@testing-library/react';
import type { ReactElement } from 'react';
import { SWRConfig } from 'swr';
import { vi } from 'vitest';
import type { ErrorCode } from '@/lib/contracts/errors';

export type Call = { url: string; method: string; body: unknown };

type Reply = { status?: number; body?: unknown; headers?: Record<string, string> };

/**
 * Replaces `fetch` with `answer`, which gets each request (URL, method, parsed JSON body) and
 * returns the reply: `{ status, body }`, or 'offline' for a request that never reaches a server.
 * The calls are recorded in order.
 */
export function stubFetch(
  answer: (
    call: Call,
  ) => Reply | 'offline' | Promise<Reply>,
) {
  const calls: Call[] = [];
  const fetchStub = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const call: Call = {
      url: String(input),
      method: init.method ?? 'GET',
      body: typeof init.body === 'string' ? JSON.parse(init.body) : undefined,
    };
    calls.push(call);
    const reply = await answer(call);
    if (reply === 'offline') throw new TypeError('Failed to fetch');
    return new Response(reply.body === undefined ? null : JSON.stringify(reply.body), {
      status: reply.status ?? 200,
      headers: { 'content-type': 'application/json', ...reply.headers },
    });
  });
  vi.stubGlobal('fetch', fetchStub);
  return calls;
}

/** Renders with a cache of its own, so no test sees another's data. */
export function renderFresh(ui: ReactElement) {
  return render(
    <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>{ui}</SWRConfig>,
  );
}

/** Beadline's error body. */
export const errorBody = (
  code: ErrorCode,
  message: string,
  fields?: Record<string, string>,
  extra: Record<string, unknown> = {},
) => ({ ...extra, error: { code, message, ...(fields ? { fields } : {}) } });
