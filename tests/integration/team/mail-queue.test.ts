import { randomBytes } from 'node:crypto';
import { createServer } from 'node:net';
import { afterAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { recordAudit } from '@/db/queries/audit';
import PgBoss from 'pg-boss';
import { databaseUrl } from '@/db/url';
import {
  closeMailQueue,
  enqueueMail,
  ensureQueue,
  getBoss,
  startMailWorker,
  stopMailWorker,
} from '@/server/mail/queue';
import { invitationMail } from '@/lib/email/messages';
import { startMailFake, type MailFake } from '@/scripts/services/mail-fake';
import { createOrganization, uniqueEmail } from '../support/fixtures';
import { until } from '../../support/until';
import { auditRows, mailJobsTo } from './support';

// A queue of this test's own, so the running server's worker (npm test) does not take its jobs.
const QUEUE = `mail-test-${randomBytes(4).toString('hex')}`;

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
  });
}

let fake: MailFake | null = null;

afterAll(async () => {
  await fake?.close();
  const boss = await getBoss();
  await boss.deleteQueue(QUEUE).catch(() => undefined);
  await closeMailQueue();
  await closeDb();
});

describe('mail queue', () => {
  it('queues created at the same time (mail and certificate workers starting, two servers) all come up', async () => {
    // A fresh database: the workers of one server and of a second one create their queues at
    // once. pg-boss's create_queue alters shared tables, which deadlocked and left mail unsent.
    const names = Array.from({ length: 6 }, (_, i) => `${QUEUE}-start-${i}`);
    const other = new PgBoss({
      connectionString: databaseUrl(),
      max: 3,
      supervise: false,
      schedule: false,
    });
    await other.start();
    const boss = await getBoss();
    try {
      const results = await Promise.allSettled([
        ...names.map((name) => ensureQueue(boss, name)),
        // The second server: its own client, the same queues and queues of its own.
        ...names.map((name) => ensureQueue(other, name)),
        ...names.map((name) => ensureQueue(other, `${name}-other`)),
      ]);
      expect(results.filter((r) => r.status === 'rejected')).toEqual([]);
      for (const name of [...names, ...names.map((n) => `${n}-other`)]) {
        expect(await boss.getQueue(name)).toMatchObject({ name });
        await boss.deleteQueue(name);
      }
    } finally {
      await other.stop({ graceful: false, wait: true });
    }
  });

  it('a job is written with its transaction or not at all', async () => {
    const to = uniqueEmail('rolled-back');
    const lab = await createOrganization();
    await expect(
      getDb().transaction(async (tx) => {
        await recordAudit(tx, {
          actorUserId: null,
          organizationId: lab.id,
          action: 'test.mail',
          entityType: 'test',
        });
        await enqueueMail(tx, { kind: 'test', ...message(to) }, { queue: QUEUE });
        throw new Error('the change fails');
      }),
    ).rejects.toThrow('the change fails');
    expect(await mailJobsTo(to, QUEUE)).toHaveLength(0);
    expect(await auditRows({ organizationId: lab.id })).toHaveLength(0);
  });

  it('with the SMTP server down, an invitation stays queued and goes out once it is back', async () => {
    const smtpPort = await freePort();
    const to = uniqueEmail('outage');
    await getDb().transaction((tx) =>
      enqueueMail(
        tx,
        { kind: 'invitation', ...message(to) },
        { queue: QUEUE, retryDelay: 1, retryBackoff: false },
      ),
    );
    const workerId = await startMailWorker({
      queue: QUEUE,
      smtpUrl: `smtp://127.0.0.1:${smtpPort}`,
      pollingIntervalSeconds: 0.5,
    });
    try {
      // Nothing listens: the delivery fails and the job goes back to the queue to be retried.
      const retried = await until(
        () => mailJobsTo(to, QUEUE),
        (jobs) => (jobs[0]?.retryCount ?? 0) >= 2,
        20_000,
      );
      expect(retried).toHaveLength(1);
      expect(retried[0]!.retryCount).toBeGreaterThanOrEqual(2);
      expect(['retry', 'active', 'created']).toContain(retried[0]!.state);

      // The server comes back on the same port: the next retry delivers, once.
      fake = await startMailFake({ smtpPort, webPort: 0 });
      const delivered = await until(
        async () => fake!.messages.filter((m) => m.to.includes(to)),
        (mails) => mails.length > 0,
        20_000,
      );
      expect(delivered).toHaveLength(1);
      expect(delivered[0]!.subject).toBe('Join Outage Lab on Beadline');
      expect(delivered[0]!.text).toContain('/invitations/accept?token=outage-token');
      expect(delivered[0]!.html).toContain('Beadline');
      const done = await until(
        () => mailJobsTo(to, QUEUE),
        (jobs) => jobs[0]?.state === 'completed',
        10_000,
      );
      expect(done[0]!.state).toBe('completed');
    } finally {
      if (workerId) await stopMailWorker(workerId);
    }
  });
});

function message(to: string) {
  return invitationMail({
    to,
    organizationName: 'Outage Lab',
    inviterName: 'Test Admin',
    role: 'analyst',
    link: 'http://127.0.0.1:3000/invitations/accept?token=outage-token',
    expiresAt: new Date(Date.now() + 86_400_000),
  });
}
