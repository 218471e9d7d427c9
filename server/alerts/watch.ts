import 'server-only';
import { addWatcher, isWatching as findWatching, removeWatcher } from '@/db/queries/alerts';
import { findRecord, ownedBy } from '@/db/queries/records';
import { recordAudit } from '@/db/queries/audit';
import { database, inTransaction } from '@/db/queries/transaction';
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

/**
 * Starts or stops watching a coating of the organization. A change of who is told about a
 * coating is audited in the same transaction; asking for what is already so writes nothing.
 */
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
  await inTransaction(async (tx) => {
    const watcher = { organizationId: actor.organizationId, userId: actor.userId, coatingId };
    const changed = watching ? await addWatcher(tx, watcher) : await removeWatcher(tx, watcher);
    if (!changed) return;
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: watching ? 'coating.watch' : 'coating.unwatch',
      entityType: 'coating',
      entityId: coatingId,
    });
  });
  return { watching };
}
