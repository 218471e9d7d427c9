import 'server-only';
import { sql, type SQL } from 'drizzle-orm';
import PgBoss from 'pg-boss';
import type { Executor } from '@/db/queries/transaction';
import { databaseUrl } from '@/db/url';
import { smtpUrl } from '@/lib/email/config';
import type { MailMessage } from '@/lib/email/messages';
import { deliverMail } from '@/lib/email/transport';

/**
 * Outgoing mail goes through a job queue in PostgreSQL (pg-boss, schema `pgboss`): a mail is
 * queued in the same transaction as the change that causes it, and a worker hands it to the SMTP
 * server, retrying with doubling delays while the server is away (at least 17 hours in all), so a
 * mail outage loses nothing.
 */
export const MAIL_QUEUE = 'mail';

/** Retries: from 15 s, doubling (pg-boss adds up to as much again at random), 12 times. */
const RETRY = { retryLimit: 12, retryDelay: 15, retryBackoff: true } as const;

export type MailJob = MailMessage & { kind: string };

const globalForQueue = globalThis as typeof globalThis & {
  beadlineBoss?: Promise<PgBoss>;
};

/** Per queue client: the queues it knows exist, and the tail of its queue creations. */
const clientQueues = new WeakMap<PgBoss, { known: Set<string>; creating: Promise<unknown> }>();

function createBoss(): Promise<PgBoss> {
  const boss = new PgBoss({
    connectionString: databaseUrl(),
    max: 3,
    application_name: 'beadline-jobs',
    // A queued mail holds its link; delivered ones leave the queue's tables soon.
    archiveCompletedAfterSeconds: 300,
    deleteAfterHours: 1,
  });
  boss.on('error', (error: unknown) => console.error('[mail] queue error', error));
  return boss.start();
}

/** The process's queue client; creates the `pgboss` schema on first use. */
export async function getBoss(): Promise<PgBoss> {
  globalForQueue.beadlineBoss ??= createBoss().catch((error: unknown) => {
    globalForQueue.beadlineBoss = undefined;
    throw error;
  });
  return globalForQueue.beadlineBoss;
}

export type RetryPolicy = { retryLimit: number; retryDelay: number; retryBackoff: boolean };

/**
 * Creates `name` once per queue client (another client or process may have created it first).
 * `options` for a queue other than mail's (its policy, retries, expiry).
 *
 * pg-boss's create_queue alters tables shared by every queue, so two creations at once can
 * deadlock (the mail and certificate workers starting together on a fresh database did, and mail
 * stayed queued). One client creates its queues one at a time; a deadlock with another process
 * is retried after a short random pause.
 */
export async function ensureQueue(
  boss: PgBoss,
  name: string,
  options: Partial<Omit<PgBoss.Queue, 'name'>> = {},
): Promise<void> {
  let state = clientQueues.get(boss);
  if (!state) clientQueues.set(boss, (state = { known: new Set(), creating: Promise.resolve() }));
  if (state.known.has(name)) return;
  const created = state.creating.then(() => createQueueOnce(boss, name, options));
  state.creating = created.catch(() => undefined);
  await created;
  state.known.add(name);
}

const DEADLOCK = '40P01';
const CREATE_ATTEMPTS = 5;

async function createQueueOnce(
  boss: PgBoss,
  name: string,
  options: Partial<Omit<PgBoss.Queue, 'name'>>,
): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    if (await boss.getQueue(name)) return;
    try {
      await boss.createQueue(name, { name, ...RETRY, expireInSeconds: 120, ...options });
      return;
    } catch (error) {
      if (await boss.getQueue(name)) return;
      const deadlock = (error as { code?: unknown } | null)?.code === DEADLOCK;
      if (!deadlock || attempt >= CREATE_ATTEMPTS) throw error;
      await new Promise((resolve) => setTimeout(resolve, 20 + Math.random() * 80 * attempt));
    }
  }
}

/**
 * pg-boss sends `$1`-numbered SQL; run it on the caller's drizzle transaction so the job is
 * written, or not, together with the change that asked for it.
 */
export function onTransaction(tx: Executor): PgBoss.Db {
  return {
    async executeSql(text: string, values: unknown[]) {
      const pieces = text.split(/\$(\d+)/);
      const chunks: SQL[] = pieces.map((piece, i) => {
        if (i % 2 === 0) return sql.raw(piece);
        const value = values[Number(piece) - 1];
        const param =
          value === undefined
            ? null
            : typeof value === 'object' && value !== null
              ? JSON.stringify(value)
              : value;
        return sql`${param}`;
      });
      const rows = await tx.execute(sql.join(chunks));
      return { rows: [...rows] };
    },
  };
}

/**
 * Queues one mail on the transaction `tx`. `queue` and `retry` exist for tests (a queue of their
 * own, quick retries); the product always uses the defaults.
 */
export async function enqueueMail(
  tx: Executor,
  job: MailJob,
  options: { queue?: string; retryDelay?: number; retryBackoff?: boolean } = {},
): Promise<string | null> {
  const boss = await getBoss();
  const queue = options.queue ?? MAIL_QUEUE;
  await ensureQueue(boss, queue);
  return boss.send(queue, job, {
    db: onTransaction(tx),
    ...(options.retryDelay !== undefined ? { retryDelay: options.retryDelay } : {}),
    ...(options.retryBackoff !== undefined ? { retryBackoff: options.retryBackoff } : {}),
  });
}

/**
 * Starts handing queued mails to the SMTP server. A failed delivery throws, so pg-boss keeps the
 * job and retries it. Returns the worker id (for stopMailWorker).
 */
export async function startMailWorker(
  options: { queue?: string; smtpUrl?: string; pollingIntervalSeconds?: number } = {},
): Promise<string | null> {
  const url = options.smtpUrl ?? smtpUrl();
  if (!url) {
    console.warn(
      '[mail] SMTP_URL is not set: mails stay queued until it is set and the server restarts',
    );
    return null;
  }
  const boss = await getBoss();
  const queue = options.queue ?? MAIL_QUEUE;
  await ensureQueue(boss, queue);
  return boss.work<MailJob>(
    queue,
    { batchSize: 20, pollingIntervalSeconds: options.pollingIntervalSeconds ?? 1 },
    async (jobs) => {
      // Each mail on its own: one refused address must not hold back the rest of the batch.
      const failed: string[] = [];
      let lastError = '';
      for (const job of jobs) {
        const { kind: _kind, ...message } = job.data;
        try {
          await deliverMail(url, message);
        } catch (error) {
          failed.push(job.id);
          lastError = error instanceof Error ? error.message : String(error);
        }
      }
      if (failed.length > 0) {
        console.warn(
          `[mail] ${failed.length} of ${jobs.length} mails not delivered, retrying later: ${lastError}`,
        );
        // Failed jobs go back to the queue for a retry; pg-boss completes the delivered ones.
        await boss.fail(queue, failed);
      }
    },
  );
}

export async function stopMailWorker(id: string): Promise<void> {
  const boss = await getBoss();
  await boss.offWork({ id });
}

/** Stops the queue client (scripts and tests). */
export async function closeMailQueue(): Promise<void> {
  const pending = globalForQueue.beadlineBoss;
  globalForQueue.beadlineBoss = undefined;
  if (pending) await (await pending).stop({ graceful: false, wait: true }).catch(() => undefined);
}
