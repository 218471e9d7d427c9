import { randomBytes } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { newId } from '@/db/queries/ids';
import { auditEvents, webhookDeliveries, webhooks } from '@/db/schema';
import {
  createWebhookAction,
  redeliverWebhookAction,
  removeWebhookAction,
} from '@/app/(app)/team/webhooks/actions';
import * as importRoute from '@/app/api/batches/[id]/import/route';
import * as reviewsRoute from '@/app/api/reviews/route';
import * as decisionRoute from '@/app/api/reviews/[id]/decision/route';
import { ROLES, type Role } from '@/lib/auth/permissions';
import type { FormState } from '@/lib/contracts/forms';
import { webhookEventSchema, type WebhookEventType } from '@/lib/contracts/webhooks';
import {
  EVENT_ID_HEADER,
  EVENT_TYPE_HEADER,
  SIGNATURE_HEADER,
  TIMESTAMP_HEADER,
  verifyWebhook,
} from '@/lib/webhooks/signature';
import { saveDropAnalysis } from '@/server/drops/save-analysis';
import { closeMailQueue, getBoss } from '@/server/mail/queue';
import { emitWebhookEvent } from '@/server/webhooks/emit';
import { loadWebhookLog } from '@/server/webhooks/load';
import { startWebhookWorker, stopWebhookWorker } from '@/server/webhooks/queue';
import { redeliverWebhook } from '@/server/webhooks/redeliver';
import { removeWebhook } from '@/server/webhooks/remove';
import { until } from '../../support/until';
import { startReceiver, type Receiver, type ReceivedWebhook } from '../../support/webhook-receiver';
import { labWithEveryRole, type Member } from '../support/fixtures';
import { simulateRequest } from '../support/request';
import {
  insertBatch,
  insertCoating,
  insertDrop,
  insertPhotoWithBytes,
  insertSample,
} from '../support/seed';
import { ensureLibrary } from '../records/helpers';
import { call, idParams } from '../surface-energy/helpers';

/*
 * Issue 15, item 4: webhooks against the real PostgreSQL and pg-boss, delivered to receivers on
 * 127.0.0.1 (npm test sets WEBHOOK_ALLOW_PRIVATE=1, for this process and the test server).
 */

const FIXTURE = path.resolve(__dirname, '../../../fixtures/drops/cap-60-noisy.png');
const BASE_URL = process.env.E2E_BASE_URL;

let lab: { id: string; name: string };
let otherLab: { id: string; name: string };
let members: Record<Role, Member>;
let outsider: Member;
const receivers: Receiver[] = [];
const workers: string[] = [];
const testQueues: string[] = [];

beforeAll(async () => {
  await ensureLibrary();
  ({ lab, otherLab, members, outsider } = await labWithEveryRole());
});

afterAll(async () => {
  for (const id of workers) await stopWebhookWorker(id).catch(() => undefined);
  for (const receiver of receivers) await receiver.close();
  const boss = await getBoss();
  for (const queue of testQueues) await boss.deleteQueue(queue).catch(() => undefined);
  await closeMailQueue();
  await closeDb();
});

async function receiver(options: { port?: number; status?: number } = {}) {
  const started = await startReceiver(options);
  receivers.push(started);
  return started;
}

async function worker(options: Parameters<typeof startWebhookWorker>[0] = {}) {
  const id = await startWebhookWorker({ pollingIntervalSeconds: 0.5, ...options });
  workers.push(id);
  return id;
}

function form(fields: Record<string, string>): FormData {
  const data = new FormData();
  for (const [key, value] of Object.entries(fields)) data.set(key, value);
  return data;
}

/** Registers a webhook through the Webhooks page's action, as `member`. */
async function register(
  member: Member,
  url: string,
  events: WebhookEventType[],
): Promise<FormState> {
  simulateRequest({ sessionId: member.sessionId });
  const fields: Record<string, string> = { url, description: 'Test receiver' };
  for (const type of events) fields[`event:${type}`] = 'on';
  return createWebhookAction({}, form(fields));
}

async function webhookOf(url: string, organizationId = lab.id) {
  const [row] = await getDb()
    .select()
    .from(webhooks)
    .where(and(eq(webhooks.organizationId, organizationId), eq(webhooks.url, url)));
  return row!;
}

async function deliveriesOf(webhookId: string) {
  return getDb().select().from(webhookDeliveries).where(eq(webhookDeliveries.webhookId, webhookId));
}

function verified(secret: string, request: ReceivedWebhook) {
  return verifyWebhook(
    secret,
    {
      signature: request.headers[SIGNATURE_HEADER] as string,
      timestamp: request.headers[TIMESTAMP_HEADER] as string,
    },
    request.body,
  );
}

const typesOf = (requests: ReceivedWebhook[]) =>
  requests.map((r) => r.headers[EVENT_TYPE_HEADER]).sort();

describe('signed deliveries of each event', () => {
  it('a saved analysis, a changed verdict and a decided review reach the receivers, signed, once per subscription', async () => {
    // Two workers in this process (and the test server's, when it runs): each delivery once.
    // They work the product's queue, so they stop at the end of this test: the tests below turn
    // WEBHOOK_ALLOW_PRIVATE off for a moment and must not fail other tests' deliveries.
    const productWorkers = [await worker(), await worker()];
    try {
      await deliverEachEvent();
    } finally {
      for (const id of productWorkers) await stopWebhookWorker(id);
    }
  }, 90_000);
});

async function deliverEachEvent() {
  {
    const everything = await receiver();
    const reviewsOnly = await receiver();
    const all = await register(members.admin, everything.url(), [
      'analysis.saved',
      'review.decided',
      'batch.verdict_changed',
    ]);
    expect(all.message).toBeUndefined();
    expect(all.notice).toMatch(/not shown again/);
    const secret = all.values!.secret!;
    expect(secret).toMatch(/^whsec_/);
    const onlyReviews = await register(members.admin, reviewsOnly.url(), ['review.decided']);
    const reviewSecret = onlyReviews.values!.secret!;
    // The secret is kept for signing, but is never in the audit row.
    const audit = await getDb()
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.organizationId, lab.id), eq(auditEvents.action, 'webhook.create')));
    expect(audit).toHaveLength(2);
    expect(JSON.stringify(audit)).not.toContain(secret);

    // A saved analysis: analysis.saved, and the batch's first verdict (none → judged).
    const coatingId = await insertCoating(lab.id, `WH-${newId().slice(0, 5)}`);
    const batchId = await insertBatch(lab.id, coatingId, 'L-HOOK');
    const sampleId = await insertSample(lab.id, batchId, 'S1');
    const photoId = await insertPhotoWithBytes(
      lab.id,
      members.analyst.userId,
      await readFile(FIXTURE),
    );
    const saved = await saveDropAnalysis(
      { organizationId: lab.id, userId: members.analyst.userId },
      photoId,
      {
        sampleId,
        probeLiquidId: 'liquid-water',
        method: 'circle',
        baseline: null,
        expectedRevision: 0,
      },
    );

    // A decided review.
    await insertDrop(lab.id, sampleId, { revisions: [{ meanDeg: 92 }] });
    const submitted = await call(reviewsRoute.POST, '/api/reviews', {
      method: 'POST',
      sessionId: members.analyst.sessionId,
      body: { batchId, note: '' },
    });
    expect(submitted.status).toBe(201);
    const reviewId = submitted.body.reviewId as string;
    const decided = await call(decisionRoute.POST, `/api/reviews/${reviewId}/decision`, {
      method: 'POST',
      sessionId: members.reviewer.sessionId,
      body: { decision: 'reject', comment: 'Baseline drawn through the reflection.' },
      params: idParams(reviewId),
    });
    expect(decided.status).toBe(200);

    await until(
      () => everything.received,
      (r) => r.length >= 3,
      30_000,
    );
    await until(
      () => reviewsOnly.received,
      (r) => r.length >= 1,
      30_000,
    );
    // Give any second worker time to send a repeat, which must not come.
    await new Promise((resolve) => setTimeout(resolve, 2500));
    expect(typesOf(everything.received)).toEqual([
      'analysis.saved',
      'batch.verdict_changed',
      'review.decided',
    ]);
    expect(typesOf(reviewsOnly.received)).toEqual(['review.decided']);

    for (const request of everything.received) {
      expect(verified(secret, request)).toEqual({ ok: true });
      expect(verified(reviewSecret, request)).toEqual({ ok: false, reason: 'mismatch' });
      expect(request.headers['content-type']).toBe('application/json');
      const event = webhookEventSchema.parse(JSON.parse(request.body));
      expect(event.id).toBe(request.headers[EVENT_ID_HEADER]);
      expect(event.type).toBe(request.headers[EVENT_TYPE_HEADER]);
      expect(event.organizationId).toBe(lab.id);
      expect(Math.abs(Date.parse(event.time) - Date.now())).toBeLessThan(120_000);
      if (event.type === 'analysis.saved') {
        expect(event.data).toMatchObject({
          analysisId: saved.analysisId,
          dropId: saved.dropId,
          revision: 1,
          sampleId,
          method: 'circle',
        });
        // The fixture is a spherical cap of 60° (fixtures/generator).
        expect(event.data.meanDeg as number).toBeCloseTo(60, 0);
      }
      if (event.type === 'review.decided') {
        expect(event.data).toMatchObject({ reviewId, decision: 'rejected', batchId });
      }
      if (event.type === 'batch.verdict_changed') {
        expect(event.data).toMatchObject({ batchId, lotCode: 'L-HOOK', previous: null });
      }
    }
    const review = reviewsOnly.received[0]!;
    expect(verified(reviewSecret, review)).toEqual({ ok: true });
    // The same event id for both subscriptions; each its own signature.
    const reviewToAll = everything.received.find(
      (r) => r.headers[EVENT_TYPE_HEADER] === 'review.decided',
    )!;
    expect(review.headers[EVENT_ID_HEADER]).toBe(reviewToAll.headers[EVENT_ID_HEADER]);

    const hook = await webhookOf(everything.url());
    const rows = await until(
      () => deliveriesOf(hook.id),
      (r) => r.every((d) => d.status === 'delivered'),
      5000,
    );
    expect(rows.map((d) => [d.status, d.attempts, d.lastStatusCode])).toEqual([
      ['delivered', 1, 200],
      ['delivered', 1, 200],
      ['delivered', 1, 200],
    ]);
  }
}

describe('imported angles', () => {
  it('an import of hand-read angles records one analysis.saved event per imported analysis, in its transaction', async () => {
    const listener = await receiver();
    expect(
      (await register(members.admin, listener.url(), ['analysis.saved'])).message,
    ).toBeUndefined();
    const hook = await webhookOf(listener.url());
    const coatingId = await insertCoating(lab.id, `WI-${newId().slice(0, 5)}`);
    const batchId = await insertBatch(lab.id, coatingId, 'L-IMPORT');
    const sampleId = await insertSample(lab.id, batchId, 'S1');
    const csv = [
      'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at,Operator,Note',
      'S1,Water,101.5,102.5,2026-11-21 10:10,T. Test,',
      'S1,Water,99,100,2026-11-21 10:12,T. Test,',
    ].join('\n');
    const bad = await call(importRoute.POST, `/api/batches/${batchId}/import`, {
      method: 'POST',
      sessionId: members.analyst.sessionId,
      body: { csv: `${csv}\nS9,Water,100,100,2026-11-21 10:14,T. Test,` },
      params: idParams(batchId),
    });
    // All or nothing: a refused import records no event either.
    expect(bad.status).toBe(400);
    expect(await deliveriesOf(hook.id)).toEqual([]);
    const imported = await call(importRoute.POST, `/api/batches/${batchId}/import`, {
      method: 'POST',
      sessionId: members.analyst.sessionId,
      body: { csv },
      params: idParams(batchId),
    });
    expect(imported.status).toBeLessThan(300);
    const rows = await deliveriesOf(hook.id);
    expect(rows.map((r) => r.eventType)).toEqual(['analysis.saved', 'analysis.saved']);
    const events = rows.map((r) => webhookEventSchema.parse(JSON.parse(r.body)));
    expect(events.map((e) => e.data.meanDeg as number).sort((a, b) => a - b)).toEqual([99.5, 102]);
    for (const event of events)
      expect(event.data).toMatchObject({
        sampleId,
        method: 'manual',
        source: 'import',
        revision: 1,
      });
  });
});

describe('a receiver that is down', () => {
  it('is retried with growing waits and gets the delivery once it is back', async () => {
    const queue = `webhook-test-${randomBytes(4).toString('hex')}`;
    testQueues.push(queue);
    const retry = { retryLimit: 6, retryDelay: 1, retryBackoff: true };
    // Take a free port, then close it: nothing listens there until the receiver comes back.
    const probe = await startReceiver();
    const port = probe.port;
    await probe.close();
    const url = `http://127.0.0.1:${port}/hooks/beadline`;
    const created = await register(members.admin, url, ['analysis.saved']);
    const secret = created.values!.secret!;
    const hook = await webhookOf(url);
    const eventId = await getDb().transaction((tx) =>
      emitWebhookEvent(
        tx,
        lab.id,
        'analysis.saved',
        { analysisId: 'a-1', meanDeg: 104.5 },
        {
          queue,
          retry,
        },
      ),
    );
    expect(eventId).toBeTruthy();
    await worker({ queue, retry, pollingIntervalSeconds: 0.5 });

    // Each failed attempt records when pg-boss will try again: waits of d·2^(k−1) to d·2^k
    // seconds after the k-th failure (d = 1 s; pg-boss adds up to as much again at random).
    const seen = new Map<number, { last: Date; next: Date }>();
    await until(
      async () => {
        const [row] = await deliveriesOf(hook.id);
        if (row?.status === 'retrying' && row.lastAttemptAt && row.nextAttemptAt) {
          seen.set(row.attempts, { last: row.lastAttemptAt, next: row.nextAttemptAt });
        }
        return row;
      },
      (row) => (row?.attempts ?? 0) >= 3,
      30_000,
    );
    const [down] = await deliveriesOf(hook.id);
    expect(down!.status).toBe('retrying');
    expect(down!.lastStatusCode).toBeNull();
    expect(down!.lastError).toMatch(/refused the connection/);
    expect(seen.size).toBeGreaterThanOrEqual(2);
    for (const [attempts, { last, next }] of seen) {
      const waitSeconds = (next.getTime() - last.getTime()) / 1000;
      expect(waitSeconds).toBeGreaterThanOrEqual(2 ** (attempts - 1) - 0.5);
      expect(waitSeconds).toBeLessThanOrEqual(2 ** attempts + 1);
    }

    // The admin's log shows the failures and the next retry.
    const log = await loadWebhookLog(lab.id, hook.id);
    expect(log!.deliveries[0]).toMatchObject({ eventId, status: 'retrying' });
    expect(log!.deliveries[0]!.nextAttemptAt).toBeInstanceOf(Date);

    // Back up on the same port: the next retry delivers, once.
    const back = await receiver({ port });
    await until(
      () => back.received,
      (r) => r.length > 0,
      40_000,
    );
    const [done] = await until(
      () => deliveriesOf(hook.id),
      (r) => r[0]?.status === 'delivered',
      5000,
    );
    expect(done!.status).toBe('delivered');
    expect(done!.attempts).toBeGreaterThanOrEqual(4);
    expect(done!.nextAttemptAt).toBeNull();
    expect(back.received).toHaveLength(1);
    expect(verified(secret, back.received[0]!)).toEqual({ ok: true });
    expect(JSON.parse(back.received[0]!.body)).toMatchObject({
      id: eventId,
      type: 'analysis.saved',
      data: { analysisId: 'a-1', meanDeg: 104.5 },
    });

    // Sent again by an admin: the same event id and body, a fresh signature.
    simulateRequest({ sessionId: members.admin.sessionId });
    const again = await redeliverWebhookAction({}, form({ deliveryId: done!.id }));
    expect(again.notice).toMatch(/again/);
    await redeliverWebhook({ organizationId: lab.id, userId: members.admin.userId }, done!.id, {
      queue,
      retry,
    });
    await until(
      () => back.received,
      (r) => r.length >= 2,
      20_000,
    );
    expect(back.received[1]!.body).toBe(back.received[0]!.body);
    expect(verified(secret, back.received[1]!)).toEqual({ ok: true });
  }, 120_000);
});

describe('addresses that are refused', () => {
  it('private, loopback and link-local addresses without WEBHOOK_ALLOW_PRIVATE, and non-http schemes', async () => {
    const saved = process.env.WEBHOOK_ALLOW_PRIVATE;
    delete process.env.WEBHOOK_ALLOW_PRIVATE;
    try {
      for (const [url, reason] of [
        ['http://127.0.0.1:9/hook', /loopback/],
        ['http://localhost:9/hook', /loopback/],
        ['https://10.0.0.5/hook', /private network/],
        ['http://169.254.169.254/latest/meta-data', /link-local/],
        ['http://[::1]:9/hook', /loopback/],
      ] as const) {
        const state = await register(members.admin, url, ['analysis.saved']);
        expect(state.code).toBe('invalid_input');
        expect(state.fields?.url).toMatch(reason);
        expect(state.fields?.url).toMatch(/WEBHOOK_ALLOW_PRIVATE=1/);
      }
      const ftp = await register(members.admin, 'ftp://files.example.com/in', ['analysis.saved']);
      expect(ftp.fields?.url).toMatch(/http:\/\/ or https:\/\//);
      const none = await register(members.admin, 'https://lims.example.com/hook', []);
      expect(none.fields?.events).toMatch(/at least one event/);
      const withPassword = await register(members.admin, 'http://user:pw@127.0.0.1/', [
        'analysis.saved',
      ]);
      expect(withPassword.fields?.url).toMatch(/user name and password/);
      const stored = await getDb()
        .select()
        .from(webhooks)
        .where(eq(webhooks.url, 'https://10.0.0.5/hook'));
      expect(stored).toHaveLength(0);
    } finally {
      process.env.WEBHOOK_ALLOW_PRIVATE = saved;
    }
  });

  it('a delivery is checked again when it connects (a host that now resolves to a private address)', async () => {
    const queue = `webhook-test-${randomBytes(4).toString('hex')}`;
    testQueues.push(queue);
    const retry = { retryLimit: 0, retryDelay: 1, retryBackoff: false };
    const target = await receiver();
    // A name (checked by the connection's lookup) and an address written in the URL.
    const url = `http://localhost:${target.port}/hooks/beadline`;
    const literal = target.url('/hooks/literal');
    for (const address of [url, literal]) {
      const created = await register(members.admin, address, ['review.decided']);
      expect(created.message).toBeUndefined();
    }
    const hook = await webhookOf(url);
    const literalHook = await webhookOf(literal);
    const saved = process.env.WEBHOOK_ALLOW_PRIVATE;
    delete process.env.WEBHOOK_ALLOW_PRIVATE;
    try {
      await getDb().transaction((tx) =>
        emitWebhookEvent(tx, lab.id, 'review.decided', { reviewId: 'r-1' }, { queue, retry }),
      );
      await worker({ queue, retry, pollingIntervalSeconds: 0.5 });
      const [row] = await until(
        () => deliveriesOf(hook.id),
        (r) => r[0]?.status === 'failed',
        20_000,
      );
      expect(row!.status).toBe('failed');
      expect(row!.lastError).toMatch(/resolves to .*loopback.*WEBHOOK_ALLOW_PRIVATE=1/);
      const [literalRow] = await until(
        () => deliveriesOf(literalHook.id),
        (r) => r[0]?.status === 'failed',
        20_000,
      );
      expect(literalRow!.lastError).toMatch(/127\.0\.0\.1 is a loopback address/);
      expect(target.received).toHaveLength(0);
    } finally {
      process.env.WEBHOOK_ALLOW_PRIVATE = saved;
    }
  }, 40_000);
});

describe('who may see and manage webhooks', () => {
  it('only admins register, delete and send again; other roles are refused', async () => {
    const url = `http://127.0.0.1:9/roles-${newId().slice(0, 6)}`;
    for (const role of ['analyst', 'reviewer', 'viewer'] as const) {
      const state = await register(members[role], url, ['analysis.saved']);
      expect(state.code).toBe('forbidden');
    }
    expect(await getDb().select().from(webhooks).where(eq(webhooks.url, url))).toHaveLength(0);
    await register(members.admin, url, ['analysis.saved']);
    const hook = await webhookOf(url);
    for (const role of ['analyst', 'viewer'] as const) {
      simulateRequest({ sessionId: members[role].sessionId });
      const removed = await removeWebhookAction({}, form({ webhookId: hook.id }));
      expect(removed.code).toBe('forbidden');
    }
    expect(await webhookOf(url)).toBeDefined();
  });

  it('another organization’s admin can neither read, send again nor delete them', async () => {
    const url = `http://127.0.0.1:9/tenant-${newId().slice(0, 6)}`;
    await register(members.admin, url, ['review.decided']);
    const hook = await webhookOf(url);
    const unworked = `webhook-test-${randomBytes(4).toString('hex')}`;
    testQueues.push(unworked);
    const eventId = await getDb().transaction((tx) =>
      emitWebhookEvent(tx, lab.id, 'review.decided', { reviewId: 'r-2' }, { queue: unworked }),
    );
    expect(eventId).toBeTruthy();
    const [delivery] = await deliveriesOf(hook.id);
    const them = { organizationId: otherLab.id, userId: outsider.userId };
    expect(await loadWebhookLog(otherLab.id, hook.id)).toBeNull();
    await expect(redeliverWebhook(them, delivery!.id)).rejects.toMatchObject({ code: 'not_found' });
    await expect(removeWebhook(them, hook.id)).rejects.toMatchObject({ code: 'not_found' });
    simulateRequest({ sessionId: outsider.sessionId });
    const removed = await removeWebhookAction({}, form({ webhookId: hook.id }));
    expect(removed.code).toBe('not_found');
    // An event of the other organization is not delivered to this organization's webhooks.
    const theirs = await getDb().transaction((tx) =>
      emitWebhookEvent(tx, otherLab.id, 'review.decided', { reviewId: 'r-3' }),
    );
    expect(theirs).toBeNull();
    expect(await deliveriesOf(hook.id)).toHaveLength(1);
    // The owner deletes it, with its log.
    await removeWebhook({ organizationId: lab.id, userId: members.admin.userId }, hook.id);
    expect(await deliveriesOf(hook.id)).toHaveLength(0);
  });

  describe.skipIf(!BASE_URL)('the pages on the running server', () => {
    for (const role of ROLES) {
      const allowed = role === 'admin';
      it(`${role}: /team/webhooks ${allowed ? '200' : '403'}`, async () => {
        const url = `http://127.0.0.1:9/page-${role}`;
        if (role === 'admin') await register(members.admin, url, ['analysis.saved']);
        const response = await fetch(`${BASE_URL}/team/webhooks`, {
          redirect: 'manual',
          headers: { cookie: `beadline_session=${members[role].sessionId}` },
        });
        expect(response.status).toBe(allowed ? 200 : 403);
        const html = await response.text();
        if (allowed) expect(html).toContain(url);
        else expect(html).not.toContain('http://127.0.0.1:9/');
      });
    }

    it('the log of another organization’s webhook is not found', async () => {
      const url = `http://127.0.0.1:9/log-${newId().slice(0, 6)}`;
      await register(members.admin, url, ['analysis.saved']);
      const hook = await webhookOf(url);
      const own = await fetch(`${BASE_URL}/team/webhooks/${hook.id}`, {
        headers: { cookie: `beadline_session=${members.admin.sessionId}` },
      });
      expect(own.status).toBe(200);
      expect(await own.text()).toContain(url);
      const theirs = await fetch(`${BASE_URL}/team/webhooks/${hook.id}`, {
        headers: { cookie: `beadline_session=${outsider.sessionId}` },
      });
      expect(theirs.status).toBe(404);
      expect(await theirs.text()).not.toContain(url);
    });
  });
});
