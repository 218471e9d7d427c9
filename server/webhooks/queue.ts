import 'server-only';
import type PgBoss from 'pg-boss';
import { claimDelivery, recordAttempt } from '@/db/queries/webhooks';
import { database, type Executor } from '@/db/queries/transaction';
import {
  EVENT_ID_HEADER,
  EVENT_TYPE_HEADER,
  SIGNATURE_HEADER,
  signWebhook,
  TIMESTAMP_HEADER,
} from '@/lib/webhooks/signature';
import { ensureQueue, getBoss, onTransaction, type RetryPolicy } from '../mail/queue';
import { DELIVERY_TIMEOUT_MS, postOnce } from './post';

/**
 * Webhook deliveries go through pg-boss like mail: one job per delivery, written in the same
 * transaction as the event, taken by one worker of whichever web process gets it first.
 */
export const WEBHOOK_QUEUE = 'webhook';

/**
 * Retries: 12 after the first attempt, waiting 30 s, then doubling each time; pg-boss adds up to
 * as much again at random, so the attempts spread out over 17 to 34 hours in all.
 */
export const WEBHOOK_RETRY: RetryPolicy = { retryLimit: 12, retryDelay: 30, retryBackoff: true };

/** Longer than one attempt can take, so a job is not handed out twice while it runs. */
const JOB_EXPIRY_SECONDS = 60;
const CLAIM_SECONDS = Math.ceil(DELIVERY_TIMEOUT_MS / 1000) + 20;

type DeliveryJob = { deliveryId: string };

export type QueueOptions = { queue?: string; retry?: RetryPolicy };

/** Queues one job per delivery on the transaction `tx`. */
export async function enqueueDeliveries(
  tx: Executor,
  deliveryIds: string[],
  options: QueueOptions = {},
): Promise<void> {
  if (deliveryIds.length === 0) return;
  const boss = await getBoss();
  const queue = options.queue ?? WEBHOOK_QUEUE;
  const retry = options.retry ?? WEBHOOK_RETRY;
  await ensureQueue(boss, queue, { ...retry, expireInSeconds: JOB_EXPIRY_SECONDS });
  for (const deliveryId of deliveryIds) {
    await boss.send(queue, { deliveryId } satisfies DeliveryJob, {
      db: onTransaction(tx),
      ...retry,
    });
  }
}

/**
 * One attempt of one delivery: signed with the webhook's secret over this attempt's timestamp
 * and the stored body. Answers what to record, or null when another worker holds the delivery
 * or it was delivered already (once per subscription, whatever the queue does).
 */
async function attempt(deliveryId: string) {
  const delivery = await claimDelivery(deliveryId, CLAIM_SECONDS);
  if (!delivery) return null;
  const attemptedAt = new Date();
  const timestamp = Math.floor(attemptedAt.getTime() / 1000);
  const outcome = await postOnce(delivery.url, delivery.body, {
    [EVENT_ID_HEADER]: delivery.eventId,
    [EVENT_TYPE_HEADER]: delivery.eventType,
    [TIMESTAMP_HEADER]: String(timestamp),
    [SIGNATURE_HEADER]: signWebhook(delivery.secret, timestamp, delivery.body),
  });
  return { attemptedAt, outcome };
}

type AttemptRecord = Parameters<typeof recordAttempt>[2];

async function handle(boss: PgBoss, queue: string, job: PgBoss.Job<DeliveryJob>) {
  const { deliveryId } = job.data;
  const done = await attempt(deliveryId);
  if (!done) return;
  const { attemptedAt, outcome } = done;
  let record: AttemptRecord;
  if (outcome.ok) {
    record = {
      status: 'delivered',
      lastStatusCode: outcome.statusCode,
      lastError: null,
      nextAttemptAt: null,
      deliveredAt: attemptedAt,
      attemptedAt,
    };
  } else {
    // Hand the job back to pg-boss for its next retry, then read when that will be.
    await boss.fail(queue, job.id, { error: outcome.error });
    const after = await boss.getJobById<DeliveryJob>(queue, job.id);
    const retrying = after?.state === 'retry';
    record = {
      status: retrying ? 'retrying' : 'failed',
      lastStatusCode: outcome.statusCode,
      lastError: outcome.error,
      nextAttemptAt: retrying ? after.startAfter : null,
      deliveredAt: null,
      attemptedAt,
    };
  }
  await recordAttempt(database(), deliveryId, record);
}

/**
 * Starts delivering queued webhooks in this process. Each job is one delivery; a failed one is
 * retried by pg-boss with the queue's backoff. Returns the worker id (for stopWebhookWorker).
 */
export async function startWebhookWorker(
  options: { queue?: string; retry?: RetryPolicy; pollingIntervalSeconds?: number } = {},
): Promise<string> {
  const boss = await getBoss();
  const queue = options.queue ?? WEBHOOK_QUEUE;
  await ensureQueue(boss, queue, {
    ...(options.retry ?? WEBHOOK_RETRY),
    expireInSeconds: JOB_EXPIRY_SECONDS,
  });
  return boss.work<DeliveryJob>(
    queue,
    { batchSize: 5, pollingIntervalSeconds: options.pollingIntervalSeconds ?? 1 },
    async (jobs) => {
      // In parallel: a slow receiver holds up only its own delivery.
      await Promise.all(jobs.map((job) => handle(boss, queue, job)));
    },
  );
}

export async function stopWebhookWorker(id: string): Promise<void> {
  const boss = await getBoss();
  await boss.offWork({ id });
}
