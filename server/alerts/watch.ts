import 'server-only';
import { addWatcher, isWatching as findWatching, removeWatcher } from '@/db/queries/alerts';
import { findRecord, ownedBy } from '@/db/queries/records';
import { database } from '@/db/queries/transaction';
import { coatings } from '@/db/schema';
import { notFound } from '@/lib/app-error';
import type { Actor } from '../actor';

/** Whether the user gets an e-mail when a batch of this coating turns out of spec. */
export async function isWatching(
  userId: string,
  coatingId: string,
): Promise<{ watching: boolean }> {
  return { watching: await findWatching(userId, coatingId) };
}

/** Starts or stops watching a coating of the organization. */
export async function setWatching(
  actor: Actor,
  coatingId: string,
  watching: boolean,
): Promise<{ watching: boolean }> {
  const coating = await findRecord(
    database(),
    coatings,
    ownedBy(coatings, actor.organizationId),
    coatingId,
  );
  if (!coating) throw notFound('That coating');
  if (watching) await addWatcher({ ...actor, coatingId });
  else await removeWatcher({ userId: actor.userId, coatingId });
  return { watching };
}
