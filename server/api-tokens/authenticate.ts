import 'server-only';
import { findApiTokenByHash, updateApiToken, type ApiTokenRow } from '@/db/queries/api-tokens';
import { recordAudit } from '@/db/queries/audit';
import { database, inTransaction } from '@/db/queries/transaction';
import { AppError, forbidden } from '@/lib/app-error';
import { tokenCan, type Action, type ApiTokenScope } from '@/lib/auth/permissions';
import { hashToken } from '@/lib/auth/tokens';
import type { Actor } from '../actor';

/** Who calls /api/v1: the token's organization, acting as the admin who made the token. */
export type TokenCaller = Actor & { tokenId: string; scope: ApiTokenScope };

/** Last-used times are written at most this often per token (one write per minute, not per call). */
const LAST_USED_RESOLUTION_MS = 60_000;

const refused = (message: string) =>
  new AppError(
    'unauthorized',
    `${message} Send a valid API token as "Authorization: Bearer <token>"; an admin makes one on the API access page.`,
  );

/** The token of an `Authorization: Bearer …` header, or null. */
export function bearerToken(header: string | null): string | null {
  const match = /^Bearer\s+(\S+)\s*$/i.exec(header ?? '');
  return match ? match[1] : null;
}

/**
 * Checks a bearer token and that its scope allows `action`; records when and from where it was
 * used (a use from an address not seen before is audited).
 */
export async function authenticateApiToken(
  token: string | null,
  action: Action,
  ipAddress: string,
  what: string,
  now = new Date(),
): Promise<TokenCaller> {
  if (!token) throw refused('This request carries no API token.');
  const row = await findApiTokenByHash(hashToken(token));
  if (!row) throw refused('This API token is not known.');
  if (row.revokedAt) throw refused('This API token was revoked.');
  if (row.expiresAt.getTime() <= now.getTime()) throw refused('This API token has expired.');
  if (!tokenCan(row.scope, action)) {
    throw forbidden(`${what} with an API token of scope "${row.scope}"`);
  }
  await noteUse(row, ipAddress, now);
  return {
    organizationId: row.organizationId,
    userId: row.createdByUserId,
    tokenId: row.id,
    scope: row.scope,
  };
}

async function noteUse(row: ApiTokenRow, ipAddress: string, now: Date) {
  const newAddress = row.lastUsedAddress !== ipAddress;
  if (newAddress) {
    await inTransaction(async (tx) => {
      await updateApiToken(tx, row.id, { lastUsedAt: now, lastUsedAddress: ipAddress });
      await recordAudit(tx, {
        actorUserId: row.createdByUserId,
        organizationId: row.organizationId,
        action: 'api_token.new_address',
        entityType: 'api_token',
        entityId: row.id,
        before: { address: row.lastUsedAddress },
        after: { address: ipAddress, name: row.name },
      });
    });
    return;
  }
  if (!row.lastUsedAt || now.getTime() - row.lastUsedAt.getTime() >= LAST_USED_RESOLUTION_MS) {
    await updateApiToken(database(), row.id, { lastUsedAt: now });
  }
}
