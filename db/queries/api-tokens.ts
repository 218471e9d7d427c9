import 'server-only';
import { and, desc, eq } from 'drizzle-orm';
import { apiTokens, users } from '../schema';
import { database, type Executor } from './transaction';

/*
 * API tokens: only the SHA-256 of each token is stored (lib/auth/tokens.ts hashes it);
 * server/api-tokens makes, checks and revokes them.
 */

export type ApiTokenRow = typeof apiTokens.$inferSelect;

export async function insertApiToken(db: Executor, row: typeof apiTokens.$inferInsert) {
  await db.insert(apiTokens).values(row);
}

/** The organization's tokens, newest first, with the name of who made each. */
export async function listApiTokens(organizationId: string) {
  return database()
    .select({
      id: apiTokens.id,
      name: apiTokens.name,
      scope: apiTokens.scope,
      prefix: apiTokens.prefix,
      createdBy: users.name,
      createdAt: apiTokens.createdAt,
      expiresAt: apiTokens.expiresAt,
      lastUsedAt: apiTokens.lastUsedAt,
      lastUsedAddress: apiTokens.lastUsedAddress,
      revokedAt: apiTokens.revokedAt,
    })
    .from(apiTokens)
    .leftJoin(users, eq(users.id, apiTokens.createdByUserId))
    .where(eq(apiTokens.organizationId, organizationId))
    .orderBy(desc(apiTokens.createdAt), desc(apiTokens.id));
}

export async function findApiTokenByHash(tokenHash: string): Promise<ApiTokenRow | null> {
  const [row] = await database().select().from(apiTokens).where(eq(apiTokens.tokenHash, tokenHash));
  return row ?? null;
}

export async function lockApiToken(db: Executor, organizationId: string, id: string) {
  const [row] = await db
    .select()
    .from(apiTokens)
    .where(and(eq(apiTokens.id, id), eq(apiTokens.organizationId, organizationId)))
    .for('update');
  return row ?? null;
}

export async function updateApiToken(
  db: Executor,
  id: string,
  changes: Partial<Pick<ApiTokenRow, 'lastUsedAt' | 'lastUsedAddress' | 'revokedAt'>>,
) {
  await db.update(apiTokens).set(changes).where(eq(apiTokens.id, id));
}
