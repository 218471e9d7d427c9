import 'server-only';
import { insertApiToken } from '@/db/queries/api-tokens';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { inTransaction } from '@/db/queries/transaction';
import { hashToken, newToken } from '@/lib/auth/tokens';
import type { ApiTokenCreate } from '@/lib/contracts/api-tokens';
import type { Actor } from '../actor';

/** Every API token starts with this, so a leaked one is easy to recognise and search for. */
export const API_TOKEN_PREFIX = 'bdl_';
const DAY_MS = 24 * 60 * 60 * 1000;

/**
 * Makes an API token for the organization. The token is answered once and only its SHA-256 is
 * kept; the creation is audited (without the token).
 */
export async function createApiToken(
  actor: Actor,
  input: ApiTokenCreate,
  now = new Date(),
): Promise<{ id: string; token: string; expiresAt: Date }> {
  const { token: secret } = newToken();
  const token = `${API_TOKEN_PREFIX}${secret}`;
  const tokenHash = hashToken(token);
  const id = newId();
  const expiresAt = new Date(now.getTime() + input.expiresInDays * DAY_MS);
  await inTransaction(async (tx) => {
    await insertApiToken(tx, {
      id,
      organizationId: actor.organizationId,
      name: input.name,
      scope: input.scope,
      prefix: token.slice(0, API_TOKEN_PREFIX.length + 6),
      tokenHash,
      createdByUserId: actor.userId,
      expiresAt,
    });
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'api_token.create',
      entityType: 'api_token',
      entityId: id,
      after: { name: input.name, scope: input.scope, expiresAt: expiresAt.toISOString() },
    });
  });
  return { id, token, expiresAt };
}
