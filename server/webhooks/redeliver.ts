import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { inTransaction } from '@/db/queries/transaction';
import { findDelivery, resetDelivery } from '@/db/queries/webhooks';
import { notFound } from '@/lib/app-error';
import type { Actor } from '../actor';
import { enqueueDeliveries, type QueueOptions } from './queue';

/**
 * Sends a delivery again, now, with a fresh set of retries: the same event id and body under a
 * new timestamp and signature (a receiver that already has the event id drops the repeat).
 */
export async function redeliverWebhook(
  actor: Actor,
  deliveryId: string,
  options: QueueOptions = {},
): Promise<{ webhookId: string }> {
  return inTransaction(async (tx) => {
    const delivery = await findDelivery(tx, actor.organizationId, deliveryId);
    if (!delivery) throw notFound('That delivery');
    await resetDelivery(tx, delivery.id);
    await enqueueDeliveries(tx, [delivery.id], options);
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'webhook.redeliver',
      entityType: 'webhook',
      entityId: delivery.webhookId,
      after: { deliveryId: delivery.id, eventId: delivery.eventId, previous: delivery.status },
    });
    return { webhookId: delivery.webhookId };
  });
}
