import { appUrl } from '@/lib/config';
import { CLIENT_ADDRESS_HEADER, EDGE_HEADER, isEdgeToken, normalizeAddress } from './forwarded';

/**
 * True when the headers were stamped by Beadline's own server (scripts/serve.ts), so its
 * client address is real and any forwarded header left in them came from a trusted proxy.
 */
function fromOwnServer(headers: Headers): boolean {
  return isEdgeToken(headers.get(EDGE_HEADER));
}

let warned = false;

/**
 * The caller's network address: the socket peer, or behind a proxy listed in TRUSTED_PROXIES
 * the client it forwarded for (lib/auth/forwarded.ts). Never a header a client sent itself:
 * served any other way than through scripts/serve.ts the address is "unknown".
 */
export function clientAddress(headers: Headers): string {
  if (fromOwnServer(headers)) return normalizeAddress(headers.get(CLIENT_ADDRESS_HEADER));
  if (!warned) {
    warned = true;
    console.warn(
      '[auth] this request did not come through scripts/serve.ts (npm start); client addresses are unknown',
    );
  }
  return 'unknown';
}

/** An origin (scheme, host and port) as the URL API writes it, or null. */
function originOf(value: string | null | undefined): string | null {
  if (!value) return null;
  try {
    const origin = new URL(value).origin;
    return origin === 'null' ? null : origin;
  } catch {
    return null;
  }
}

/**
 * The public origin a trusted proxy says the browser used (X-Forwarded-Proto and -Host, first
 * values), or null. Only for requests from Beadline's own server, which drops these headers
 * unless the peer is a trusted proxy.
 */
function forwardedOrigin(headers: Headers): string | null {
  if (!fromOwnServer(headers)) return null;
  const host = headers.get('x-forwarded-host')?.split(',')[0]?.trim();
  const proto = headers.get('x-forwarded-proto')?.split(',')[0]?.trim().toLowerCase();
  if (!host || (proto !== 'http' && proto !== 'https')) return null;
  return originOf(`${proto}://${host}`);
}

/**
 * CSRF defence for cookie-authenticated mutations: the Origin header must be this site's origin
 * — scheme, host and port of APP_URL — or, behind a trusted proxy, the public origin it reports.
 * A Host or X-Forwarded-Host header a client sent is never enough.
 */
export function isSameOrigin(headers: Headers): boolean {
  const origin = originOf(headers.get('origin'));
  if (!origin) return false;
  if (origin === originOf(appUrl())) return true;
  return origin === forwardedOrigin(headers);
}
