import 'server-only';
import { newId } from '@/db/queries/ids';
import { insertDeliveries, webhooksFor } from '@/db/queries/webhooks';
import type { Executor } from '@/db/queries/transaction';
import type { WebhookEvent, WebhookEventType } from '@/lib/contracts/webhooks';
import { enqueueDeliveries, type QueueOptions } from './queue';

/**
 * Records an event for every webhook of the organization subscribed to its type, on the
 * transaction of the change that caused it: a delivery row and a queued job per webhook, written
 * together with the change or not at all. Answers the event's id, or null when nobody listens.
 * `options` exist for tests (a queue of their own, quick retries).
 */
export async function emitWebhookEvent(
  tx: Executor,
  organizationId: string,
  type: WebhookEventType,
  data: Record<string, unknown>,
  options: QueueOptions = {},
): Promise<string | null> {
  const subscribers = await webhooksFor(tx, organizationId, type);
  if (subscribers.length === 0) return null;
  const event: WebhookEvent = {
    id: newId(),
    type,
    time: new Date().toISOString(),
    organizationId,
    data,
  };
  const body = JSON.stringify(event);
  const rows = subscribers.map((webhook) => ({
    id: newId(),
    organizationId,
    webhookId: webhook.id,
    eventId: event.id,
    eventType: type,
    body,
  }));
  await insertDeliveries(tx, rows);
  await enqueueDeliveries(
    tx,
    rows.map((row) => row.id),
    options,
  );
  return event.id;
}
