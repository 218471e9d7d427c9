import { createHmac } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { refusedAddressReason } from '@/lib/webhooks/addresses';
import {
  hmacSha256Hex,
  newWebhookSecret,
  signWebhook,
  verifyWebhook,
} from '@/lib/webhooks/signature';

describe('HMAC-SHA256', () => {
  it('matches RFC 4231 test case 2 (key "Jefe")', () => {
    // RFC 4231, section 4.3 (Test Case 2): Key = "Jefe",
    // Data = "what do ya want for nothing?", HMAC-SHA-256 below.
    const expected = '5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843';
    expect(hmacSha256Hex('Jefe', 'what do ya want for nothing?')).toBe(expected);
    // Node's own HMAC agrees on the same vector.
    expect(createHmac('sha256', 'Jefe').update('what do ya want for nothing?').digest('hex')).toBe(
      expected,
    );
  });

  it('matches RFC 4231 test case 1 (20 bytes of 0x0b, "Hi There")', () => {
    // RFC 4231, section 4.2 (Test Case 1).
    expect(hmacSha256Hex(Buffer.alloc(20, 0x0b), 'Hi There')).toBe(
      'b0344c61d8db38535ca8afceaf0bf12b881dc200c9833da726e9376c2e32cff7',
    );
  });
});

describe('webhook signatures', () => {
  const secret = 'whsec_test-secret';
  const body = JSON.stringify({ id: 'evt1', type: 'analysis.saved', data: { meanDeg: 104.2 } });
  const timestamp = 1_764_683_400;
  const now = new Date(timestamp * 1000 + 30_000);

  it('signs the timestamp, a dot and the raw body', () => {
    expect(signWebhook(secret, timestamp, body)).toBe(
      `v1=${createHmac('sha256', secret).update(`${timestamp}.${body}`).digest('hex')}`,
    );
  });

  it('a receiver accepts its own signature and refuses any change', () => {
    const signature = signWebhook(secret, timestamp, body);
    const headers = { signature, timestamp: String(timestamp) };
    expect(verifyWebhook(secret, headers, body, { now })).toEqual({ ok: true });
    expect(verifyWebhook(secret, headers, body.replace('104.2', '114.2'), { now })).toEqual({
      ok: false,
      reason: 'mismatch',
    });
    expect(verifyWebhook('whsec_other', headers, body, { now })).toEqual({
      ok: false,
      reason: 'mismatch',
    });
    // The same body and signature under another timestamp: the signature covers the timestamp.
    expect(
      verifyWebhook(secret, { signature, timestamp: String(timestamp + 1) }, body, { now }),
    ).toEqual({ ok: false, reason: 'mismatch' });
    expect(verifyWebhook(secret, { signature: null, timestamp: '1' }, body, { now })).toEqual({
      ok: false,
      reason: 'missing',
    });
    expect(verifyWebhook(secret, { signature, timestamp: 'soon' }, body, { now })).toEqual({
      ok: false,
      reason: 'bad_timestamp',
    });
  });

  it('a replay older than the tolerance is refused', () => {
    const headers = { signature: signWebhook(secret, timestamp, body), timestamp: String(timestamp) };
    const later = new Date((timestamp + 301) * 1000);
    expect(verifyWebhook(secret, headers, body, { now: later })).toEqual({
      ok: false,
      reason: 'too_old',
    });
    expect(verifyWebhook(secret, headers, body, { now: later, toleranceSeconds: 600 })).toEqual({
      ok: true,
    });
  });

  it('secrets are prefixed and random', () => {
    const a = newWebhookSecret();
    expect(a).toMatch(/^whsec_[A-Za-z0-9_-]{43}$/);
    expect(newWebhookSecret()).not.toBe(a);
  });
});

describe('webhook addresses', () => {
  it('public unicast addresses pass', () => {
    for (const address of ['8.8.8.8', '93.184.216.34', '2001:4860:4860::8888']) {
      expect(refusedAddressReason(address)).toBeNull();
    }
  });

  it('private, loopback, link-local and other special ranges are refused, saying which', () => {
    const cases: [string, RegExp][] = [
      ['10.1.2.3', /private network/],
      ['172.16.0.9', /private network/],
      ['192.168.1.20', /private network/],
      ['127.0.0.1', /loopback/],
      ['::1', /loopback/],
      ['169.254.169.254', /link-local/],
      ['fe80::1', /link-local/],
      ['fd12:3456::1', /unique-local/],
      ['100.64.0.1', /carrier-grade NAT/],
      ['0.0.0.0', /unspecified/],
      ['::ffff:127.0.0.1', /loopback/],
      ['::ffff:10.0.0.1', /private network/],
      ['224.0.0.1', /multicast/],
      ['64:ff9b::a00:1', /NAT64/],
    ];
    for (const [address, reason] of cases) expect(refusedAddressReason(address)).toMatch(reason);
  });
});
