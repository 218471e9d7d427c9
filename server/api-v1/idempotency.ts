import 'server-only';
import {
  deleteIdempotencyKey,
  findIdempotencyKey,
  insertIdempotencyKey,
  retakeStaleIdempotencyKey,
  saveIdempotentReply,
} from '@/db/queries/api-idempotency';
import { AppError, invalidField } from '@/lib/app-error';

/** A first request that has not answered after this long is taken to have died. */
const ABANDONED_AFTER_MS = 5 * 60 * 1000;
export const MAX_IDEMPOTENCY_KEY_LENGTH = 200;

export type StoredReply = { status: number; body: unknown };
export type Claim = { kind: 'first' } | { kind: 'replay'; reply: StoredReply };

/**
 * Claims an Idempotency-Key for a token before the work is done: the first request with the key
 * goes ahead; a retry gets the stored reply of the first; the same key with another request, or
 * while the first still runs, is a 409 idempotency_conflict.
 */
export async function claimIdempotencyKey(
  tokenId: string,
  key: string,
  requestHash: string,
): Promise<Claim> {
  if (key.length === 0 || key.length > MAX_IDEMPOTENCY_KEY_LENGTH) {
    throw invalidField(
      'Idempotency-Key',
      `The Idempotency-Key header must be 1 to ${MAX_IDEMPOTENCY_KEY_LENGTH} characters; use a UUID.`,
    );
  }
  if (await insertIdempotencyKey(tokenId, key, requestHash)) return { kind: 'first' };
  const row = await findIdempotencyKey(tokenId, key);
  if (!row) return claimIdempotencyKey(tokenId, key, requestHash);
  if (row.requestHash !== requestHash) {
    throw new AppError(
      'idempotency_conflict',
      'This Idempotency-Key was already used with a different request. Use a new key for a new request.',
    );
  }
  if (row.status !== null) return { kind: 'replay', reply: { status: row.status, body: row.body } };
  const staleBefore = new Date(Date.now() - ABANDONED_AFTER_MS);
  if (await retakeStaleIdempotencyKey(tokenId, key, staleBefore)) return { kind: 'first' };
  throw new AppError(
    'idempotency_conflict',
    'The first request with this Idempotency-Key is still running. Retry in a few seconds with the same key.',
    { extra: { retryAfterSeconds: 2 } },
  );
}

/** Keeps the reply of the first request for its retries. */
export async function completeIdempotencyKey(tokenId: string, key: string, reply: StoredReply) {
  await saveIdempotentReply(tokenId, key, reply);
}

/** Frees the key after a failure on our side, so a retry does the work. */
export async function releaseIdempotencyKey(tokenId: string, key: string) {
  await deleteIdempotencyKey(tokenId, key);
}
