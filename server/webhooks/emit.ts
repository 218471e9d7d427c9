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
  const [id] = await emitWebhookEvents(tx, organizationId, type, [data], options);
  return id ?? null;
}

/**
 * Several events of one type from one change (an import of many analyses): the subscribers are
 * read once, and every delivery row and job is written in one go. Answers the events' ids, or
 * none when nobody listens.
 */
export async function emitWebhookEvents(
  tx: Executor,
  organizationId: string,
  type: WebhookEventType,
  dataList: Record<string, unknown>[],
  options: QueueOptions = {},
): Promise<string[]> {
  if (dataList.length === 0) return [];
  const subscribers = await webhooksFor(tx, organizationId, type);
  if (subscribers.length === 0) return [];
  const time = new Date().toISOString();
  const events: WebhookEvent[] = dataList.map((data) => ({
    id: newId(),
    type,
    time,
    organizationId,
    data,
  }));
  const rows = events.flatMap((event) => {
    const body = JSON.stringify(event);
    return subscribers.map((webhook) => ({
      id: newId(),
      organizationId,
      webhookId: webhook.id,
      eventId: event.id,
      eventType: type,
      body,
    }));
  });
  await insertDeliveries(tx, rows);
  await enqueueDeliveries(
    tx,
    rows.map((row) => row.id),
    options,
  );
  return events.map((event) => event.id);
}
