/**
 * Who is really connected, and which forwarded headers to believe.
 *
 * Next.js does not tell route handlers or server actions the socket's peer address, and it
 * passes a client's own X-Forwarded-For / X-Forwarded-Host through. So Beadline is served by
 * scripts/serve.ts, a thin Node server in front of Next's request handler, which for every
 * request (edgeRequestHeaders):
 * - removes the forwarded headers (X-Forwarded-For/-Host/-Proto/-Port, X-Real-IP, Forwarded)
 *   unless the socket peer is a proxy listed in TRUSTED_PROXIES (empty by default);
 * - works out the client's address: the peer itself, or, behind trusted proxies, the first
 *   address in X-Forwarded-For, read from the right, that is not a trusted proxy;
 * - sets it as X-Beadline-Client-Address, with X-Beadline-Edge carrying a random token of this
 *   process, so the app (lib/auth/origin.ts) believes these headers only when they were set by
 *   its own server and never when a client sends them.
 *
 * No Next.js import here: scripts/serve.ts loads it before Next starts.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { BlockList, isIP } from 'node:net';

export const CLIENT_ADDRESS_HEADER = 'x-beadline-client-address';
export const EDGE_HEADER = 'x-beadline-edge';
export const FORWARDED_HEADERS = [
  'x-forwarded-for',
  'x-forwarded-host',
  'x-forwarded-proto',
  'x-forwarded-port',
  'x-real-ip',
  'forwarded',
] as const;

export class TrustedProxiesError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'TrustedProxiesError';
  }
}

export type TrustedProxies = { check(address: string): boolean; entries: string[] };

/** An address as Node reports it, comparable: no IPv6 zone, IPv4-mapped IPv6 as plain IPv4. */
export function normalizeAddress(raw: string | undefined | null): string {
  if (!raw) return 'unknown';
  let address = raw.trim().replace(/^\[|\]$/g, '');
  const zone = address.indexOf('%');
  if (zone >= 0) address = address.slice(0, zone);
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(address);
  if (mapped) address = mapped[1]!;
  return isIP(address) ? address.toLowerCase() : 'unknown';
}

/**
 * TRUSTED_PROXIES: addresses or CIDR ranges separated by commas or spaces, e.g.
 * "127.0.0.1, 10.0.0.0/8, fd00::/8". Empty (the default): no proxy is trusted and forwarded
 * headers are ignored. A malformed entry throws, naming it.
 */
export function parseTrustedProxies(value: string | undefined): TrustedProxies {
  const list = new BlockList();
  const entries = (value ?? '').split(/[\s,]+/).filter(Boolean);
  for (const entry of entries) {
    const [address, bits, extra] = entry.split('/');
    const family = isIP(address ?? '');
    const prefix = bits === undefined ? undefined : Number(bits);
    const maxBits = family === 6 ? 128 : 32;
    if (
      !family ||
      extra !== undefined ||
      (prefix !== undefined && !(Number.isInteger(prefix) && prefix >= 0 && prefix <= maxBits))
    ) {
      throw new TrustedProxiesError(
        `TRUSTED_PROXIES: "${entry}" is not an IP address or CIDR range (like 10.0.0.0/8).`,
      );
    }
    const type = family === 6 ? 'ipv6' : 'ipv4';
    if (prefix === undefined) list.addAddress(address!, type);
    else list.addSubnet(address!, prefix, type);
  }
  return {
    entries,
    check(candidate: string) {
      const normal = normalizeAddress(candidate);
      const family = isIP(normal);
      if (!family || entries.length === 0) return false;
      return list.check(normal, family === 6 ? 'ipv6' : 'ipv4');
    },
  };
}

/**
 * The client behind `peer`: the peer itself unless it is a trusted proxy; then the addresses in
 * X-Forwarded-For are read from the right (each proxy appends the address it saw) and the first
 * that is not a trusted proxy is the client. A malformed entry ends the walk at the last
 * trusted hop, so nobody can smuggle an address past a proxy.
 */
export function clientAddressBehind(
  peer: string,
  forwardedFor: string | string[] | undefined,
  trusted: TrustedProxies,
): string {
  let client = normalizeAddress(peer);
  if (!trusted.check(client)) return client;
  const chain = (Array.isArray(forwardedFor) ? forwardedFor.join(',') : (forwardedFor ?? ''))
    .split(',')
    .map((hop) => hop.trim())
    .filter(Boolean);
  for (let i = chain.length - 1; i >= 0; i--) {
    const hop = normalizeAddress(chain[i]);
    if (hop === 'unknown') return client;
    client = hop;
    if (!trusted.check(hop)) return client;
  }
  return client;
}

type HeaderBag = Record<string, string | string[] | undefined>;

/**
 * Rewrites the headers of an incoming Node request in place, as described at the top: what the
 * app may believe about the network, and nothing a client made up.
 */
export function edgeRequestHeaders(
  headers: HeaderBag,
  peer: string | undefined,
  trusted: TrustedProxies,
  token: string,
): void {
  const peerAddress = normalizeAddress(peer);
  const viaTrustedProxy = trusted.check(peerAddress);
  const client = clientAddressBehind(peerAddress, headers['x-forwarded-for'], trusted);
  if (!viaTrustedProxy) for (const name of FORWARDED_HEADERS) delete headers[name];
  headers[CLIENT_ADDRESS_HEADER] = client;
  headers[EDGE_HEADER] = token;
}

const TOKEN_KEY = Symbol.for('beadline.edge-token');
type WithToken = typeof globalThis & { [TOKEN_KEY]?: string };

/**
 * This process's random edge token: scripts/serve.ts stamps it on every request, the app checks
 * it. A server started some other way never stamps it, so its requests carry no trusted headers.
 */
export function edgeToken(): string {
  const holder = globalThis as WithToken;
  holder[TOKEN_KEY] ??= randomBytes(24).toString('base64url');
  return holder[TOKEN_KEY];
}

/** True when `value` is this process's edge token. */
export function isEdgeToken(value: string | null | undefined): boolean {
  if (!value) return false;
  const expected = Buffer.from(edgeToken());
  const given = Buffer.from(value);
  return expected.length === given.length && timingSafeEqual(expected, given);
}
