import { apiTokens } from '@/db/schema';
import { getDb } from '@/db/client';
import { eq } from 'drizzle-orm';
import type { ApiTokenScope } from '@/lib/auth/permissions';
import { createApiToken } from '@/server/api-tokens/create';
import { APP_ORIGIN, simulateRequest } from '../support/request';

/** A token of `scope` made by `adminUserId` through the service, as the API access page does. */
export async function makeToken(
  organizationId: string,
  adminUserId: string,
  scope: ApiTokenScope,
  expiresInDays = 30,
) {
  return createApiToken(
    { organizationId, userId: adminUserId },
    { name: `Test ${scope}`, scope, expiresInDays },
  );
}

export async function expireToken(id: string) {
  await getDb()
    .update(apiTokens)
    .set({ expiresAt: new Date(Date.now() - 1000) })
    .where(eq(apiTokens.id, id));
}

/** A request to /api/v1 with a bearer token (no cookie, no Origin: an instrument, not a browser). */
export function v1Request(
  path: string,
  options: {
    token?: string | null;
    method?: string;
    json?: unknown;
    form?: FormData;
    headers?: Record<string, string>;
    clientAddress?: string;
  } = {},
): Request {
  simulateRequest({ origin: null, clientAddress: options.clientAddress });
  const headers = new Headers(options.headers);
  if (options.token) headers.set('authorization', `Bearer ${options.token}`);
  let body: BodyInit | undefined;
  if (options.json !== undefined) {
    headers.set('content-type', 'application/json');
    body = JSON.stringify(options.json);
  } else if (options.form) {
    body = options.form;
  }
  return new Request(`${APP_ORIGIN}/api/v1${path}`, {
    method: options.method ?? (body ? 'POST' : 'GET'),
    headers,
    body,
  });
}

export const noParams = { params: Promise.resolve({}) } as never;
export const idParams = (id: string) => ({ params: Promise.resolve({ id }) });
