import 'server-only';
import { and, eq, isNull, lt } from 'drizzle-orm';
import { apiIdempotencyKeys } from '../schema';
import { database } from './transaction';

export type IdempotencyRow = typeof apiIdempotencyKeys.$inferSelect;

const key = (tokenId: string, idempotencyKey: string) =>
  and(eq(apiIdempotencyKeys.tokenId, tokenId), eq(apiIdempotencyKeys.key, idempotencyKey));

/** Inserts the key as running; false when the token already used it. */
export async function insertIdempotencyKey(
  tokenId: string,
  idempotencyKey: string,
  requestHash: string,
): Promise<boolean> {
  const rows = await database()
    .insert(apiIdempotencyKeys)
    .values({ tokenId, key: idempotencyKey, requestHash })
    .onConflictDoNothing()
    .returning({ key: apiIdempotencyKeys.key });
  return rows.length === 1;
}

export async function findIdempotencyKey(tokenId: string, idempotencyKey: string) {
  const [row] = await database()
    .select()
    .from(apiIdempotencyKeys)
    .where(key(tokenId, idempotencyKey));
  return row ?? null;
}

/** Takes over a key whose first request has run since before `staleBefore` without a reply. */
export async function retakeStaleIdempotencyKey(
  tokenId: string,
  idempotencyKey: string,
  staleBefore: Date,
): Promise<boolean> {
  const rows = await database()
    .update(apiIdempotencyKeys)
    .set({ createdAt: new Date() })
    .where(
      and(
        key(tokenId, idempotencyKey),
        isNull(apiIdempotencyKeys.status),
        lt(apiIdempotencyKeys.createdAt, staleBefore),
      ),
    )
    .returning({ key: apiIdempotencyKeys.key });
  return rows.length === 1;
}

export async function saveIdempotentReply(
  tokenId: string,
  idempotencyKey: string,
  reply: { status: number; body: unknown },
) {
  await database()
    .update(apiIdempotencyKeys)
    .set({ status: reply.status, body: reply.body })
    .where(key(tokenId, idempotencyKey));
}

export async function deleteIdempotencyKey(tokenId: string, idempotencyKey: string) {
  await database().delete(apiIdempotencyKeys).where(key(tokenId, idempotencyKey));
}
