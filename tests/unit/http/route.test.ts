import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { AppError } from '@/lib/app-error';
import { appUrl } from '@/lib/config';
import { ERROR_CODES } from '@/lib/contracts/errors';
import { HTTP_STATUS } from '@/server/http/errors';
import { json, route } from '@/server/http/route';

/*
 * The route wrapper on its own: a public route (no session needed) with a small body limit.
 * Origin and host are this site's (APP_URL, which the Origin check compares with), as a Beadline
 * page's fetch sends them.
 */

const ORIGIN = new URL(appUrl()).origin;

const echo = route(
  { access: 'public', body: z.object({ angleDeg: z.number() }), maxBodyBytes: 64 },
  async ({ body }) => json({ received: body.angleDeg }),
);

function post(body: BodyInit | null, headers: Record<string, string> = {}): Request {
  return new Request(`${ORIGIN}/api/echo`, {
    method: 'POST',
    headers: {
      origin: ORIGIN,
      host: new URL(ORIGIN).host,
      'content-type': 'application/json',
      ...headers,
    },
    body,
    // A streamed body has no Content-Length.
    ...(body instanceof ReadableStream ? { duplex: 'half' } : {}),
  } as RequestInit);
}

async function errorOf(response: Response) {
  return { status: response.status, ...(await response.json()).error };
}

/** A body that arrives in pieces, as a chunked upload does. */
function chunked(...pieces: string[]): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  return new ReadableStream({
    start(controller) {
      for (const piece of pieces) controller.enqueue(encoder.encode(piece));
      controller.close();
    },
  });
}

describe('route(): JSON body', () => {
  it('parses a valid body with the contract', async () => {
    const response = await echo(post(JSON.stringify({ angleDeg: 104.2 })), undefined);
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ received: 104.2 });
  });

  it('refuses a body that says it is too large before reading it (413)', async () => {
    const response = await echo(post('{}', { 'content-length': '65' }), undefined);
    expect(await errorOf(response)).toMatchObject({ status: 413, code: 'payload_too_large' });
  });

  it('refuses a streamed body once it passes the limit (413)', async () => {
    const response = await echo(post(chunked('{"angleDeg": 1', ' '.repeat(60), '}')), undefined);
    expect(await errorOf(response)).toMatchObject({ status: 413, code: 'payload_too_large' });
  });

  it('says what is wrong with a body that is not a JSON object (400 invalid_json)', async () => {
    const cases: [BodyInit | null, RegExp][] = [
      [null, /empty/],
      ['{"angleDeg": ', /not valid JSON/],
      ['[1, 2]', /not an object/],
    ];
    for (const [body, message] of cases) {
      const error = await errorOf(await echo(post(body), undefined));
      expect(error).toMatchObject({ status: 400, code: 'invalid_json' });
      expect(error.message).toMatch(message);
      expect(error.message).toMatch(/Send the fields as a JSON object/);
    }
  });

  it('names the fields a valid JSON object gets wrong (400 invalid_input)', async () => {
    const error = await errorOf(await echo(post(JSON.stringify({ angleDeg: 'wide' })), undefined));
    expect(error).toMatchObject({ status: 400, code: 'invalid_input' });
    expect(Object.keys(error.fields)).toEqual(['angleDeg']);
  });

  it('refuses a mutation from another site before anything else (403 bad_origin)', async () => {
    const response = await echo(
      post(JSON.stringify({ angleDeg: 1 }), { origin: 'http://evil.example' }),
      undefined,
    );
    expect(await errorOf(response)).toMatchObject({ status: 403, code: 'bad_origin' });
  });
});

describe('route(): errors', () => {
  it('answers an AppError with its code’s status and body, extra keys included', async () => {
    const conflict = route({ access: 'public' }, async () => {
      throw new AppError('stale_version', 'Changed meanwhile.', {
        extra: { current: { version: 3 } },
      });
    });
    const response = await conflict(new Request(`${ORIGIN}/api/x`), undefined);
    expect(response.status).toBe(409);
    expect(await response.json()).toEqual({
      current: { version: 3 },
      error: { code: 'stale_version', message: 'Changed meanwhile.' },
    });
  });

  it('hides an unexpected error behind 500 internal', async () => {
    const broken = route({ access: 'public' }, async () => {
      throw new Error('connection reset');
    });
    const error = await errorOf(await broken(new Request(`${ORIGIN}/api/x`), undefined));
    expect(error).toMatchObject({ status: 500, code: 'internal' });
    expect(error.message).not.toMatch(/connection reset/);
  });

  it('gives every error code a status in one table', () => {
    expect(Object.keys(HTTP_STATUS).sort()).toEqual([...ERROR_CODES].sort());
    for (const status of Object.values(HTTP_STATUS)) expect(status).toBeGreaterThanOrEqual(400);
  });
});
