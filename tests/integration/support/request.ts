/** The simulated incoming request that the mocked next/headers serves (see ../setup.ts). */
export const APP_ORIGIN = 'http://127.0.0.1:3000';

export const requestState = {
  cookies: new Map<string, string>(),
  headers: new Headers(),
};

export function simulateRequest(options: { sessionId?: string | null; origin?: string | null } = {}) {
  requestState.cookies = new Map();
  if (options.sessionId) requestState.cookies.set('beadline_session', options.sessionId);
  const headers = new Headers({ host: '127.0.0.1:3000', 'x-forwarded-for': '127.0.0.1' });
  const origin = options.origin === undefined ? APP_ORIGIN : options.origin;
  if (origin) headers.set('origin', origin);
  requestState.headers = headers;
}

/** A Request for a route handler, carrying the same cookie and origin as simulateRequest. */
export function apiRequest(
  path: string,
  options: { method?: string; sessionId?: string | null; origin?: string | null; body?: unknown } = {},
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
