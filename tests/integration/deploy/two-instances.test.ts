import { spawn, type ChildProcess } from 'node:child_process';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { newId } from '@/db/queries/ids';
import { analyses, drops, reviews } from '@/db/schema';
import { createMember, createOrganization } from '../support/fixtures';
import { insertBatch, insertCoating, insertDrop, insertPhotoWithBytes, insertSample } from '../support/seed';
import { ensureLibrary } from '../records/helpers';
import { mailJobsTo } from '../team/support';

/*
 * Two web instances on one database (issue 12): the production server npm test started and a
 * second one on another port, both with the same PostgreSQL, APP_URL and mail server. Needs the
 * running test server (E2E_BASE_URL) and its build, as npm test provides.
 */

const FIRST = process.env.E2E_BASE_URL;
const SECOND_PORT = Number(process.env.TEST_PORT ?? 3100) + 9;
const SECOND = `http://127.0.0.1:${SECOND_PORT}`;
const ROOT = path.resolve(__dirname, '../../..');
const FIXTURE = path.join(ROOT, 'fixtures/drops/cap-60-noisy.png');

let second: ChildProcess | null = null;

async function waitForHealth(base: string, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    try {
      if ((await fetch(`${base}/api/health`)).ok) return;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error(`${base} did not start within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

/** A request to one instance, signed in with `sessionId`, from the app's own origin. */
function send(base: string, sessionId: string, pathname: string, body?: unknown) {
  return fetch(`${base}${pathname}`, {
    method: body === undefined ? 'GET' : 'POST',
    headers: {
      cookie: `beadline_session=${sessionId}`,
      origin: new URL(FIRST!).origin,
      ...(body === undefined ? {} : { 'content-type': 'application/json' }),
    },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
}

describe.skipIf(!FIRST)('two web instances on one database', () => {
  let lab: { id: string };
  let analyst: Awaited<ReturnType<typeof createMember>>;
  let reviewer: Awaited<ReturnType<typeof createMember>>;

  beforeAll(async () => {
    second = spawn(path.join(ROOT, 'node_modules/.bin/tsx'), ['scripts/serve.ts'], {
      cwd: ROOT,
      env: { ...process.env, NODE_ENV: 'production', PORT: String(SECOND_PORT) },
      stdio: 'ignore',
    });
    await ensureLibrary();
    lab = await createOrganization();
    analyst = await createMember(lab.id, 'analyst');
    reviewer = await createMember(lab.id, 'reviewer');
    await waitForHealth(SECOND, 90_000);
  }, 120_000);

  afterAll(async () => {
    second?.kill('SIGTERM');
    await closeDb();
  });

  it('a session works on both', async () => {
    for (const base of [FIRST!, SECOND]) {
      const response = await send(base, analyst.sessionId, '/api/me');
      expect(response.status).toBe(200);
      expect(JSON.stringify(await response.json())).toContain(analyst.email);
    }
  });

  it('simultaneous submissions of one batch to both make one review', async () => {
    const coatingId = await insertCoating(lab.id, `TI-${newId().slice(0, 5)}`);
    const batchId = await insertBatch(lab.id, coatingId, 'L-TWO');
    const sampleId = await insertSample(lab.id, batchId, 'S1');
    for (const meanDeg of [90, 92, 94]) await insertDrop(lab.id, sampleId, { revisions: [{ meanDeg }] });
    const replies = await Promise.all(
      [FIRST!, SECOND, FIRST!, SECOND].map((base) =>
        send(base, analyst.sessionId, '/api/reviews', { batchId, note: '' }),
      ),
    );
    expect(replies.map((r) => r.status).sort()).toEqual([201, 409, 409, 409]);
    expect(await getDb().select().from(reviews).where(eq(reviews.batchId, batchId))).toHaveLength(1);
  });

  it('simultaneous saves of one drop to both make one revision', async () => {
    const coatingId = await insertCoating(lab.id, `TD-${newId().slice(0, 5)}`);
    const batchId = await insertBatch(lab.id, coatingId, 'L-DROP');
    const sampleId = await insertSample(lab.id, batchId, 'S1');
    const photoId = await insertPhotoWithBytes(lab.id, analyst.userId, await readFile(FIXTURE));
    const body = { sampleId, probeLiquidId: 'liquid-water', method: 'circle', baseline: null, expectedRevision: 0 };
    const replies = await Promise.all(
      [FIRST!, SECOND].map((base) => send(base, analyst.sessionId, `/api/photos/${photoId}/drop`, body)),
    );
    expect(replies.map((r) => r.status).sort()).toEqual([201, 409]);
    const revisions = await getDb()
      .select({ revision: analyses.revision })
      .from(analyses)
      .innerJoin(drops, eq(drops.id, analyses.dropId))
      .where(eq(drops.photoId, photoId));
    expect(revisions).toEqual([{ revision: 1 }]);
  }, 60_000);

  it('a comparison cached by one instance shows a change made through the other', async () => {
    const code = `TC-${newId().slice(0, 5)}`;
    const coatingId = await insertCoating(lab.id, code);
    const batchId = await insertBatch(lab.id, coatingId, 'L-CACHE');
    const sampleId = await insertSample(lab.id, batchId, 'S1');
    const dropId = await insertDrop(lab.id, sampleId, { revisions: [{ meanDeg: 93 }] });
    const csvRow = async (base: string) => {
      const response = await send(base, analyst.sessionId, `/api/compare/drops.csv?coating=${code}`);
      expect(response.status).toBe(200);
      return (await response.text()).split('\n').find((line) => line.includes(dropId));
    };
    // Both instances compute and keep the comparison.
    for (const base of [FIRST!, SECOND]) expect(await csvRow(base)).toMatch(/draft/);
    const submitted = await send(SECOND, analyst.sessionId, '/api/reviews', { batchId, note: '' });
    expect(submitted.status).toBe(201);
    for (const base of [FIRST!, SECOND]) expect(await csvRow(base)).toMatch(/submitted/);
  });

  it('each mail is sent once and its job runs once, with both mail workers running', async () => {
    const coatingId = await insertCoating(lab.id, `TM-${newId().slice(0, 5)}`);
    const batchId = await insertBatch(lab.id, coatingId, 'L-MAIL');
    const sampleId = await insertSample(lab.id, batchId, 'S1');
    await insertDrop(lab.id, sampleId, { revisions: [{ meanDeg: 91 }] });
    const submitted = await send(FIRST!, analyst.sessionId, '/api/reviews', { batchId, note: '' });
    const { reviewId } = await submitted.json();
    const rejected = await send(SECOND, reviewer.sessionId, `/api/reviews/${reviewId}/decision`, {
      decision: 'reject',
      comment: 'Repeat the drops, please.',
    });
    expect(rejected.status).toBe(200);
    const mailbox = process.env.MAIL_FAKE_URL;
    const delivered = async () => {
      const response = await fetch(`${mailbox}/api/messages?to=${encodeURIComponent(analyst.email)}`);
      return ((await response.json()) as { subject: string }[]).filter((m) => /rejected/.test(m.subject));
    };
    const deadline = Date.now() + 30_000;
    while ((await delivered()).length === 0 && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500));
    }
    // Both workers poll every second: give the other one time to (wrongly) send it again.
    await new Promise((r) => setTimeout(r, 4_000));
    expect(await delivered()).toHaveLength(1);
    const jobs = (await mailJobsTo(analyst.email)).filter((j) => j.data.kind === 'review-rejected');
    expect(jobs).toHaveLength(1);
    expect(jobs[0]).toMatchObject({ state: 'completed', retryCount: 0 });
  }, 60_000);
});
