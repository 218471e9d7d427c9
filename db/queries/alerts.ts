import 'server-only';
import { and, eq, sql } from 'drizzle-orm';
import { getDb } from '../client';
import {
  batches,
  batchVerdicts,
  coatings,
  coatingWatchers,
  memberships,
  samples,
  users,
} from '../schema';
import { recordAudit } from './audit';
import { notFound } from '@/lib/api/errors';

export async function setWatching(input: {
  organizationId: string;
  userId: string;
  coatingId: string;
  watching: boolean;
}): Promise<{ watching: boolean }> {
  const db = getDb();
  const [coating] = await db
    .select({ id: coatings.id })
    .from(coatings)
    .where(
      and(eq(coatings.id, input.coatingId), eq(coatings.organizationId, input.organizationId)),
    );
  if (!coating) throw notFound('That coating');
  // A change of who is told about a coating is audited, in the same transaction; asking for
  // what is already so changes nothing and writes nothing.
  await db.transaction(async (tx) => {
    const changed = input.watching
      ? await tx
          .insert(coatingWatchers)
          .values({
            coatingId: input.coatingId,
            userId: input.userId,
            organizationId: input.organizationId,
          })
          .onConflictDoNothing()
          .returning({ userId: coatingWatchers.userId })
      : await tx
          .delete(coatingWatchers)
          .where(
            and(
              eq(coatingWatchers.coatingId, input.coatingId),
              eq(coatingWatchers.userId, input.userId),
            ),
          )
          .returning({ userId: coatingWatchers.userId });
    if (changed.length === 0) return;
    await recordAudit(tx, {
      actorUserId: input.userId,
      organizationId: input.organizationId,
      action: input.watching ? 'coating.watch' : 'coating.unwatch',
      entityType: 'coating',
      entityId: input.coatingId,
    });
  });
  return { watching: input.watching };
}

export async function isWatching(userId: string, coatingId: string): Promise<boolean> {
  const rows = await getDb()
    .select({ userId: coatingWatchers.userId })
    .from(coatingWatchers)
    .where(and(eq(coatingWatchers.coatingId, coatingId), eq(coatingWatchers.userId, userId)));
  return rows.length > 0;
}

/** Watchers of a coating who are still members of its organization. */
export async function watchersOf(organizationId: string, coatingId: string) {
  return getDb()
    .select({ email: users.email, name: users.name })
    .from(coatingWatchers)
    .innerJoin(users, eq(users.id, coatingWatchers.userId))
    .innerJoin(
      memberships,
      and(eq(memberships.userId, users.id), eq(memberships.organizationId, organizationId)),
    )
    .where(eq(coatingWatchers.coatingId, coatingId));
}

export async function batchWithCoating(organizationId: string, batchId: string) {
  const [row] = await getDb()
    .select({
      id: batches.id,
      lotCode: batches.lotCode,
      coatingId: coatings.id,
      coatingCode: coatings.code,
    })
    .from(batches)
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .where(and(eq(batches.id, batchId), eq(batches.organizationId, organizationId)));
  return row ?? null;
}

type Outcome = 'pass' | 'fail' | 'not-enough-data' | 'no-spec';

/**
 * Stores the batch's verdict and, in the same transaction, runs `onTurnedToFail` when it changed
 * to fail (so a mail is queued exactly once per change). Returns the previous outcome.
 */
export async function recordBatchVerdict(
  organizationId: string,
  batchId: string,
  outcome: Outcome,
  onTurnedToFail: (
    tx: Parameters<Parameters<ReturnType<typeof getDb>['transaction']>[0]>[0],
  ) => Promise<void>,
): Promise<Outcome | null> {
  return getDb().transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`verdict:${batchId}`}))`);
    const [previous] = await tx
      .select({ outcome: batchVerdicts.outcome })
      .from(batchVerdicts)
      .where(eq(batchVerdicts.batchId, batchId));
    await tx
      .insert(batchVerdicts)
      .values({ batchId, organizationId, outcome })
      .onConflictDoUpdate({
        target: batchVerdicts.batchId,
        set: { outcome, updatedAt: new Date() },
      });
    if (outcome === 'fail' && previous?.outcome !== 'fail') {
      await recordAudit(tx, {
        actorUserId: null,
        organizationId,
        action: 'batch.out_of_spec',
        entityType: 'batch',
        entityId: batchId,
        before: { outcome: previous?.outcome ?? null },
        after: { outcome },
      });
      await onTurnedToFail(tx);
    }
    return previous?.outcome ?? null;
  });
}

export async function batchIdOfSample(
  organizationId: string,
  sampleId: string,
): Promise<string | null> {
  const [row] = await getDb()
    .select({ batchId: samples.batchId })
    .from(samples)
    .where(and(eq(samples.id, sampleId), eq(samples.organizationId, organizationId)));
  return row?.batchId ?? null;
}
