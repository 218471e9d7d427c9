import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CLIENT_ADDRESS_HEADER, EDGE_HEADER, edgeToken } from '@/lib/auth/forwarded';
import { clientAddress, isSameOrigin } from '@/lib/auth/origin';

const saved = process.env.APP_URL;
beforeEach(() => {
  process.env.APP_URL = 'https://beadline.lab.example';
});
afterEach(() => {
  if (saved === undefined) delete process.env.APP_URL;
  else process.env.APP_URL = saved;
});

/** Headers as scripts/serve.ts hands them on (stamped), or as a client sent them (not). */
function headers(values: Record<string, string>, stamped = true): Headers {
  const h = new Headers(values);
  if (stamped) {
    h.set(EDGE_HEADER, edgeToken());
    if (!h.has(CLIENT_ADDRESS_HEADER)) h.set(CLIENT_ADDRESS_HEADER, '203.0.113.5');
  }
  return h;
}

describe('isSameOrigin', () => {
  it('accepts exactly the scheme, host and port of APP_URL', () => {
    expect(isSameOrigin(headers({ origin: 'https://beadline.lab.example' }))).toBe(true);
    expect(isSameOrigin(headers({ origin: 'https://beadline.lab.example:443' }))).toBe(true);
    expect(isSameOrigin(headers({ origin: 'http://beadline.lab.example' }))).toBe(false);
    expect(isSameOrigin(headers({ origin: 'https://beadline.lab.example:8443' }))).toBe(false);
    expect(isSameOrigin(headers({}))).toBe(false);
  });

  it('is not satisfied by a Host or X-Forwarded-Host header a client sent', () => {
    const evil = 'https://evil.example';
    expect(isSameOrigin(headers({ origin: evil, host: 'evil.example' }))).toBe(false);
    expect(
      isSameOrigin(
        headers({ origin: evil, 'x-forwarded-host': 'evil.example', 'x-forwarded-proto': 'https' }, false),
      ),
    ).toBe(false);
  });

  it('accepts the public origin a trusted proxy reports (headers kept by scripts/serve.ts)', () => {
    const proxied = { origin: 'https://beadline.internal.example', 'x-forwarded-host': 'beadline.internal.example', 'x-forwarded-proto': 'https' };
    expect(isSameOrigin(headers(proxied))).toBe(true);
    expect(isSameOrigin(headers({ ...proxied, 'x-forwarded-proto': 'http' }))).toBe(false);
  });
});

describe('clientAddress', () => {
  it('is the address scripts/serve.ts stamped, never X-Forwarded-For', () => {
    expect(clientAddress(headers({ 'x-forwarded-for': '198.51.100.1' }))).toBe('203.0.113.5');
    expect(clientAddress(headers({ 'x-forwarded-for': '198.51.100.1', [CLIENT_ADDRESS_HEADER]: '198.51.100.9' }, false))).toBe(
      'unknown',
    );
  });
});
