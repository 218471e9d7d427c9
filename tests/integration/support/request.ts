import { CLIENT_ADDRESS_HEADER, EDGE_HEADER, edgeToken } from '@/lib/auth/forwarded';
import { appUrl } from '@/lib/config';

/** The simulated incoming request that the mocked next/headers serves (see ../setup.ts). */
export const APP_ORIGIN = new URL(appUrl()).origin;

export const requestState = {
  cookies: new Map<string, string>(),
  headers: new Headers(),
};

/**
 * Headers as scripts/serve.ts hands them to the app: the client's address, stamped with this
 * process's edge token.
 */
export function simulateRequest(
  options: { sessionId?: string | null; origin?: string | null; clientAddress?: string } = {},
) {
  requestState.cookies = new Map();
  if (options.sessionId) requestState.cookies.set('beadline_session', options.sessionId);
  const headers = new Headers({
    host: new URL(APP_ORIGIN).host,
    [CLIENT_ADDRESS_HEADER]: options.clientAddress ?? '127.0.0.1',
    [EDGE_HEADER]: edgeToken(),
  });
  const origin = options.origin === undefined ? APP_ORIGIN : options.origin;
  if (origin) headers.set('origin', origin);
  requestState.headers = headers;
}

/** A Request for a route handler, carrying the same cookie and origin as simulateRequest. */
export function apiRequest(
  path: string,
  options: {
    method?: string;
    sessionId?: string | null;
    origin?: string | null;
    body?: unknown;
    clientAddress?: string;
  } = {},
): Request {
  simulateRequest(options);
  const headers = new Headers(requestState.headers);
  if (options.sessionId) headers.set('cookie', `beadline_session=${options.sessionId}`);
  if (options.body !== undefined) headers.set('content-type', 'application/json');
  return new Request(`${APP_ORIGIN}${path}`, {
    method: options.method ?? 'GET',
    headers,
    body: options.body === undefined ? undefined : JSON.stringify(options.body),
  });
}
