import 'server-only';
import { and, arrayContains, desc, eq, isNull, lt, or, sql } from 'drizzle-orm';
import type { WebhookEventType } from '@/lib/contracts/webhooks';
import { users, webhookDeliveries, webhooks } from '../schema';
import { database, type Executor } from './transaction';

/*
 * Webhook subscriptions and their deliveries. Every read takes the organization, so one lab
 * never sees or touches another's webhooks; server/webhooks decides what a missing row means.
 */

export type WebhookRow = typeof webhooks.$inferSelect;
export type WebhookDeliveryRow = typeof webhookDeliveries.$inferSelect;

export async function insertWebhook(db: Executor, row: typeof webhooks.$inferInsert) {
  await db.insert(webhooks).values(row);
}

/** The organization's webhooks, newest first, with who made each and how its deliveries went. */
export async function listWebhooks(organizationId: string) {
  return database()
    .select({
      id: webhooks.id,
      url: webhooks.url,
      description: webhooks.description,
      events: webhooks.events,
      createdBy: users.name,
      createdAt: webhooks.createdAt,
      delivered: sql<number>`(select count(*)::int from ${webhookDeliveries} d
        where d.webhook_id = ${webhooks.id} and d.status = 'delivered')`,
      failing: sql<number>`(select count(*)::int from ${webhookDeliveries} d
        where d.webhook_id = ${webhooks.id} and d.status in ('retrying', 'failed'))`,
    })
    .from(webhooks)
    .leftJoin(users, eq(users.id, webhooks.createdByUserId))
    .where(eq(webhooks.organizationId, organizationId))
    .orderBy(desc(webhooks.createdAt), desc(webhooks.id));
}

export async function findWebhook(
  organizationId: string,
  id: string,
  db: Executor = database(),
): Promise<WebhookRow | null> {
  const [row] = await db
    .select()
    .from(webhooks)
    .where(and(eq(webhooks.id, id), eq(webhooks.organizationId, organizationId)));
  return row ?? null;
}

export async function deleteWebhook(db: Executor, organizationId: string, id: string) {
  const rows = await db
    .delete(webhooks)
    .where(and(eq(webhooks.id, id), eq(webhooks.organizationId, organizationId)))
    .returning({ id: webhooks.id, url: webhooks.url, events: webhooks.events });
  return rows[0] ?? null;
}

/** The webhooks of the organization subscribed to `type`. */
export async function webhooksFor(db: Executor, organizationId: string, type: WebhookEventType) {
  return db
    .select({ id: webhooks.id })
    .from(webhooks)
    .where(and(eq(webhooks.organizationId, organizationId), arrayContains(webhooks.events, [type])));
}

export async function insertDeliveries(
  db: Executor,
  rows: (typeof webhookDeliveries.$inferInsert)[],
) {
  if (rows.length === 0) return;
  await db.insert(webhookDeliveries).values(rows).onConflictDoNothing();
}

/** A webhook's deliveries, newest first. */
export async function listDeliveries(organizationId: string, webhookId: string, limit = 100) {
  return database()
    .select({
      id: webhookDeliveries.id,
      eventId: webhookDeliveries.eventId,
      eventType: webhookDeliveries.eventType,
      status: webhookDeliveries.status,
      attempts: webhookDeliveries.attempts,
      lastStatusCode: webhookDeliveries.lastStatusCode,
      lastError: webhookDeliveries.lastError,
      lastAttemptAt: webhookDeliveries.lastAttemptAt,
      nextAttemptAt: webhookDeliveries.nextAttemptAt,
      deliveredAt: webhookDeliveries.deliveredAt,
      createdAt: webhookDeliveries.createdAt,
    })
    .from(webhookDeliveries)
    .where(
      and(
        eq(webhookDeliveries.organizationId, organizationId),
        eq(webhookDeliveries.webhookId, webhookId),
      ),
    )
    .orderBy(desc(webhookDeliveries.createdAt), desc(webhookDeliveries.id))
    .limit(limit);
}

export async function findDelivery(db: Executor, organizationId: string, id: string) {
  const [row] = await db
    .select()
    .from(webhookDeliveries)
    .where(
      and(eq(webhookDeliveries.id, id), eq(webhookDeliveries.organizationId, organizationId)),
    )
    .for('update');
  return row ?? null;
}

/**
 * Takes a delivery for one attempt: only when it is not delivered and no other worker holds it
 * (or that worker's claim ran out). Answers the delivery with its webhook's address and secret,
 * or null when there is nothing to send.
 */
export async function claimDelivery(id: string, claimSeconds: number) {
  const claimed = await database()
    .update(webhookDeliveries)
    .set({ claimedUntil: sql`now() + make_interval(secs => ${claimSeconds})` })
    .where(
      and(
        eq(webhookDeliveries.id, id),
        sql`${webhookDeliveries.status} <> 'delivered'`,
        or(isNull(webhookDeliveries.claimedUntil), lt(webhookDeliveries.claimedUntil, sql`now()`)),
      ),
    )
    .returning({ id: webhookDeliveries.id });
  if (claimed.length === 0) return null;
  const [row] = await database()
    .select({
      id: webhookDeliveries.id,
      eventId: webhookDeliveries.eventId,
      eventType: webhookDeliveries.eventType,
      body: webhookDeliveries.body,
      attempts: webhookDeliveries.attempts,
      url: webhooks.url,
      secret: webhooks.secret,
    })
    .from(webhookDeliveries)
    .innerJoin(webhooks, eq(webhooks.id, webhookDeliveries.webhookId))
    .where(eq(webhookDeliveries.id, id));
  return row ?? null;
}

/** Writes what an attempt found and lets the delivery go (the claim ends). */
export async function recordAttempt(
  db: Executor,
  id: string,
  outcome: Pick<
    WebhookDeliveryRow,
    'status' | 'lastStatusCode' | 'lastError' | 'nextAttemptAt' | 'deliveredAt'
  > & { attemptedAt: Date },
) {
  const { attemptedAt, ...rest } = outcome;
  await db
    .update(webhookDeliveries)
    .set({
      ...rest,
      lastAttemptAt: attemptedAt,
      attempts: sql`${webhookDeliveries.attempts} + 1`,
      claimedUntil: null,
    })
    .where(eq(webhookDeliveries.id, id));
}

/** A delivery queued again by an admin: pending, its next attempt now. */
export async function resetDelivery(db: Executor, id: string) {
  await db
    .update(webhookDeliveries)
    .set({ status: 'pending', nextAttemptAt: new Date(), claimedUntil: null })
    .where(eq(webhookDeliveries.id, id));
}
