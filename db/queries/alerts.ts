import 'server-only';
import { and, eq, sql } from 'drizzle-orm';
import { batchVerdicts, coatingWatchers, memberships, samples, users } from '../schema';
import { database, type Executor } from './transaction';

/** A batch's overall verdict, as kept to tell when it turns to fail. */
export type BatchOutcome = (typeof batchVerdicts.$inferSelect)['outcome'];

/** Adds the watcher; true when it was not watching before. */
export async function addWatcher(
  db: Executor,
  input: { organizationId: string; userId: string; coatingId: string },
): Promise<boolean> {
  const added = await db
    .insert(coatingWatchers)
    .values(input)
    .onConflictDoNothing()
    .returning({ userId: coatingWatchers.userId });
  return added.length > 0;
}

/** Removes the watcher; true when it was watching. */
export async function removeWatcher(
  db: Executor,
  input: { userId: string; coatingId: string },
): Promise<boolean> {
  const removed = await db
    .delete(coatingWatchers)
    .where(
      and(eq(coatingWatchers.coatingId, input.coatingId), eq(coatingWatchers.userId, input.userId)),
    )
    .returning({ userId: coatingWatchers.userId });
  return removed.length > 0;
}

export async function isWatching(userId: string, coatingId: string): Promise<boolean> {
  const rows = await database()
    .select({ userId: coatingWatchers.userId })
    .from(coatingWatchers)
    .where(and(eq(coatingWatchers.coatingId, coatingId), eq(coatingWatchers.userId, userId)));
  return rows.length > 0;
}

/** Watchers of a coating who are still members of its organization, with their role there. */
export async function watchersOf(db: Executor, organizationId: string, coatingId: string) {
  return db
    .select({ email: users.email, name: users.name, role: memberships.role })
    .from(coatingWatchers)
    .innerJoin(users, eq(users.id, coatingWatchers.userId))
    .innerJoin(
      memberships,
      and(eq(memberships.userId, users.id), eq(memberships.organizationId, organizationId)),
    )
    .where(eq(coatingWatchers.coatingId, coatingId));
}

/** Serialises verdict changes of one batch until the transaction ends. */
export async function lockBatchVerdict(tx: Executor, batchId: string): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`verdict:${batchId}`}))`);
}

export async function findBatchVerdict(
  tx: Executor,
  batchId: string,
): Promise<BatchOutcome | null> {
  const [row] = await tx
    .select({ outcome: batchVerdicts.outcome })
    .from(batchVerdicts)
    .where(eq(batchVerdicts.batchId, batchId));
  return row?.outcome ?? null;
}

export async function saveBatchVerdict(
  tx: Executor,
  input: { organizationId: string; batchId: string; outcome: BatchOutcome },
): Promise<void> {
  await tx
    .insert(batchVerdicts)
    .values(input)
    .onConflictDoUpdate({
      target: batchVerdicts.batchId,
      set: { outcome: input.outcome, updatedAt: new Date() },
    });
}

export async function batchIdOfSample(
  organizationId: string,
  sampleId: string,
): Promise<string | null> {
  const [row] = await database()
    .select({ batchId: samples.batchId })
    .from(samples)
    .where(and(eq(samples.id, sampleId), eq(samples.organizationId, organizationId)));
  return row?.batchId ?? null;
}
