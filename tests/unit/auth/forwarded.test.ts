import { describe, expect, it } from 'vitest';
import {
  CLIENT_ADDRESS_HEADER,
  EDGE_HEADER,
  TrustedProxiesError,
  clientAddressBehind,
  edgeRequestHeaders,
  isEdgeToken,
  edgeToken,
  normalizeAddress,
  parseTrustedProxies,
} from '@/lib/auth/forwarded';
import { addressKey } from '@/lib/auth/throttle';

const none = parseTrustedProxies('');
const proxies = parseTrustedProxies('127.0.0.1, 10.0.0.0/8 fd00::/8');

describe('TRUSTED_PROXIES', () => {
  it('trusts nobody by default', () => {
    expect(none.check('127.0.0.1')).toBe(false);
    expect(parseTrustedProxies(undefined).check('::1')).toBe(false);
  });

  it('takes addresses and CIDR ranges, IPv4-mapped IPv6 peers included', () => {
    expect(proxies.check('127.0.0.1')).toBe(true);
    expect(proxies.check('::ffff:127.0.0.1')).toBe(true);
    expect(proxies.check('10.20.30.40')).toBe(true);
    expect(proxies.check('fd12::1')).toBe(true);
    expect(proxies.check('11.0.0.1')).toBe(false);
    expect(proxies.check('not an address')).toBe(false);
  });

  it.each(['10.0.0.0/33', 'proxy.example', '10.0.0.1/8/1', '::1/129', '1.2.3'])('refuses %j', (entry) => {
    expect(() => parseTrustedProxies(entry)).toThrow(TrustedProxiesError);
    expect(() => parseTrustedProxies(entry)).toThrow(entry);
  });
});

describe('the client address', () => {
  it('is the peer when the peer is no trusted proxy, whatever X-Forwarded-For says', () => {
    expect(clientAddressBehind('203.0.113.9', '198.51.100.1', none)).toBe('203.0.113.9');
    expect(clientAddressBehind('203.0.113.9', '198.51.100.1', proxies)).toBe('203.0.113.9');
  });

  it('behind trusted proxies is the rightmost address that is not one of them', () => {
    expect(clientAddressBehind('10.0.0.2', '198.51.100.7', proxies)).toBe('198.51.100.7');
    // The client wrote the first entry itself; the proxies appended the rest.
    expect(clientAddressBehind('10.0.0.2', '1.1.1.1, 198.51.100.7, 10.0.0.5', proxies)).toBe(
      '198.51.100.7',
    );
    expect(clientAddressBehind('127.0.0.1', ['198.51.100.7', '10.1.1.1'], proxies)).toBe('198.51.100.7');
    expect(clientAddressBehind('10.0.0.2', undefined, proxies)).toBe('10.0.0.2');
    expect(clientAddressBehind('10.0.0.2', 'garbage, 10.0.0.5', proxies)).toBe('10.0.0.5');
  });

  it('normalises what Node reports', () => {
    expect(normalizeAddress('::ffff:192.0.2.1')).toBe('192.0.2.1');
    expect(normalizeAddress('[FE80::1%eth0]')).toBe('fe80::1');
    expect(normalizeAddress(undefined)).toBe('unknown');
  });

  it('counts IPv6 addresses by their /64', () => {
    expect(addressKey('2001:db8:1:2:aaaa::1')).toBe('2001:db8:1:2::/64');
    expect(addressKey('2001:0db8:0001:0002:ffff:ffff:ffff:ffff')).toBe('2001:db8:1:2::/64');
    expect(addressKey('2001:db8::1')).toBe('2001:db8:0:0::/64');
    expect(addressKey('192.0.2.1')).toBe('192.0.2.1');
  });
});

describe('edgeRequestHeaders (scripts/serve.ts)', () => {
  it('drops forwarded headers from a client and stamps the peer and the edge token', () => {
    const headers: Record<string, string | string[] | undefined> = {
      host: 'beadline.example',
      'x-forwarded-for': '198.51.100.1',
      'x-forwarded-host': 'evil.example',
      'x-forwarded-proto': 'https',
      'x-real-ip': '198.51.100.2',
      forwarded: 'for=198.51.100.3',
      [CLIENT_ADDRESS_HEADER]: '198.51.100.4',
      [EDGE_HEADER]: 'made up',
    };
    edgeRequestHeaders(headers, '203.0.113.9', none, 'token-1');
    expect(headers).toEqual({
      host: 'beadline.example',
      [CLIENT_ADDRESS_HEADER]: '203.0.113.9',
      [EDGE_HEADER]: 'token-1',
    });
  });

  it('keeps them from a trusted proxy and takes the client it forwarded for', () => {
    const headers: Record<string, string | string[] | undefined> = {
      'x-forwarded-for': '198.51.100.1',
      'x-forwarded-host': 'beadline.example',
      'x-forwarded-proto': 'https',
    };
    edgeRequestHeaders(headers, '::ffff:10.0.0.2', proxies, 'token-1');
    expect(headers).toMatchObject({
      'x-forwarded-host': 'beadline.example',
      'x-forwarded-proto': 'https',
      [CLIENT_ADDRESS_HEADER]: '198.51.100.1',
    });
  });

  it("checks the process's own token only", () => {
    expect(isEdgeToken(edgeToken())).toBe(true);
    expect(isEdgeToken('made up')).toBe(false);
    expect(isEdgeToken(null)).toBe(false);
  });
});
