import { and, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { newId } from '@/db/queries/ids';
import { analyses, auditEvents, drops, reviewItems, reviews, samples } from '@/db/schema';
import * as reviewsRoute from '@/app/api/reviews/route';
import * as decisionRoute from '@/app/api/reviews/[id]/decision/route';
import * as revocationRoute from '@/app/api/reviews/[id]/revocation/route';
import { createMember, createOrganization, TEST_PASSWORD } from '../support/fixtures';
import { insertBatch, insertCoating, insertDrop, insertSample } from '../support/seed';
import { call, idParams } from '../surface-energy/helpers';
import { ensureLibrary } from '../records/helpers';
import { mailJobsTo } from '../team/support';

/*
 * Sign-off integrity (issue 12, failures 1 and 4), against the real PostgreSQL: submission is
 * atomic and unique, a decision never contradicts another, an approval ends only by an audited
 * revocation, and nobody decides a review they submitted.
 */

type Member = Awaited<ReturnType<typeof createMember>>;
let lab: { id: string; name: string };
let analyst: Member;
let reviewer: Member;
let admin: Member;

beforeAll(async () => {
  await ensureLibrary();
  lab = await createOrganization();
  analyst = await createMember(lab.id, 'analyst');
  reviewer = await createMember(lab.id, 'reviewer');
  admin = await createMember(lab.id, 'admin');
});

afterAll(async () => {
  await closeDb();
});

/** A batch of two samples with three drops each (six draft results, invented angles). */
async function batchWithSixResults(organizationId = lab.id) {
  const coatingId = await insertCoating(organizationId, `SO-${newId().slice(0, 6)}`);
  const batchId = await insertBatch(organizationId, coatingId, `L-${newId().slice(0, 6)}`);
  for (const label of ['S1', 'S2']) {
    const sampleId = await insertSample(organizationId, batchId, label);
    for (const meanDeg of [91, 93, 95]) {
      await insertDrop(organizationId, sampleId, { revisions: [{ meanDeg }] });
    }
  }
  return batchId;
}

const submit = (sessionId: string, batchId: string) =>
  call(reviewsRoute.POST, '/api/reviews', {
    method: 'POST',
    sessionId,
    body: { batchId, note: '' },
  });

const decide = (sessionId: string, reviewId: string, body: object) =>
  call(decisionRoute.POST, `/api/reviews/${reviewId}/decision`, {
    method: 'POST',
    sessionId,
    body,
    params: idParams(reviewId),
  });

const approve = { decision: 'approve', password: TEST_PASSWORD, comment: '' };
const reject = { decision: 'reject', comment: 'Drops look contaminated.' };

const revoke = (sessionId: string, reviewId: string, reason: string) =>
  call(revocationRoute.POST, `/api/reviews/${reviewId}/revocation`, {
    method: 'POST',
    sessionId,
    body: { reason },
    params: idParams(reviewId),
  });

async function statusesUnder(batchId: string) {
  const rows = await getDb()
    .select({ status: analyses.reviewStatus })
    .from(analyses)
    .innerJoin(drops, eq(drops.id, analyses.dropId))
    .innerJoin(samples, eq(samples.id, drops.sampleId))
    .where(eq(samples.batchId, batchId));
  return rows.map((r) => r.status);
}

describe('submitting for review', () => {
  it('three simultaneous submissions of one batch make one review; the others get a clear 409', async () => {
    const batchId = await batchWithSixResults();
    const replies = await Promise.all([1, 2, 3].map(() => submit(analyst.sessionId, batchId)));
    const created = replies.filter((r) => r.status === 201);
    const refused = replies.filter((r) => r.status === 409);
    expect(created).toHaveLength(1);
    expect(created[0].body.analysisCount).toBe(6);
    expect(refused).toHaveLength(2);
    for (const r of refused) {
      expect(r.body.error.code).toBe('nothing_to_submit');
      expect(r.body.error.message).toMatch(/already in a review/);
    }
    const made = await getDb().select().from(reviews).where(eq(reviews.batchId, batchId));
    expect(made).toHaveLength(1);
    const items = await getDb()
      .select()
      .from(reviewItems)
      .where(and(eq(reviewItems.reviewId, made[0].id), eq(reviewItems.open, true)));
    expect(items).toHaveLength(6);
    expect(await statusesUnder(batchId)).toEqual(Array(6).fill('submitted'));
  });

  it('the database itself refuses a second open review of an analysis (partial unique index)', async () => {
    const batchId = await batchWithSixResults();
    const first = await submit(analyst.sessionId, batchId);
    const [item] = await getDb()
      .select()
      .from(reviewItems)
      .where(eq(reviewItems.reviewId, first.body.reviewId));
    const otherId = newId();
    await getDb().insert(reviews).values({
      id: otherId,
      organizationId: lab.id,
      scope: 'batch',
      batchId,
      analysisIds: [item.analysisId],
    });
    await expect(
      getDb().insert(reviewItems).values({ reviewId: otherId, analysisId: item.analysisId }),
    ).rejects.toThrow();
  });
});

describe('deciding', () => {
  it('a signed approval cannot be contradicted: a later decision is refused and the results stay approved', async () => {
    const batchId = await batchWithSixResults();
    const { body } = await submit(analyst.sessionId, batchId);
    const approved = await decide(reviewer.sessionId, body.reviewId, approve);
    expect(approved.status).toBe(200);
    expect(approved.body.status).toBe('approved');
    for (const who of [reviewer, admin]) {
      const later = await decide(who.sessionId, body.reviewId, reject);
      expect(later.status).toBe(409);
      expect(later.body.error.code).toBe('already_decided');
      expect(later.body.error.message).toMatch(/revok/);
    }
    expect(await statusesUnder(batchId)).toEqual(Array(6).fill('approved'));
  });

  it('a decision checks the analyses are still as reviewed: a second review over approved results cannot reject them', async () => {
    // Two reviews over the same analyses, as simultaneous submissions made them before the fix.
    const batchId = await batchWithSixResults();
    const { body } = await submit(analyst.sessionId, batchId);
    const [first] = await getDb().select().from(reviews).where(eq(reviews.id, body.reviewId));
    const duplicateId = newId();
    await getDb().insert(reviews).values({ ...first, id: duplicateId, signature: null });
    expect((await decide(reviewer.sessionId, body.reviewId, approve)).status).toBe(200);
    const contradicting = await decide(reviewer.sessionId, duplicateId, reject);
    expect(contradicting.status).toBe(409);
    expect(contradicting.body.error.code).toBe('results_changed');
    expect(await statusesUnder(batchId)).toEqual(Array(6).fill('approved'));
    const [still] = await getDb().select().from(reviews).where(eq(reviews.id, duplicateId));
    expect(still.status).toBe('submitted');
  });

  it('four-eyes: the submitter never decides their own review, and is told who can', async () => {
    const batchId = await batchWithSixResults();
    const { body } = await submit(admin.sessionId, batchId);
    for (const decision of [approve, reject]) {
      const own = await decide(admin.sessionId, body.reviewId, decision);
      expect(own.status).toBe(403);
      expect(own.body.error.code).toBe('own_review');
      expect(own.body.error.message).toContain('Test reviewer');
    }
    expect((await decide(reviewer.sessionId, body.reviewId, approve)).status).toBe(200);
  });

  it('a lab whose only reviewer submitted is told to invite another', async () => {
    const solo = await createOrganization();
    const soloAdmin = await createMember(solo.id, 'admin');
    const batchId = await batchWithSixResults(solo.id);
    const { body } = await submit(soloAdmin.sessionId, batchId);
    const own = await decide(soloAdmin.sessionId, body.reviewId, approve);
    expect(own.status).toBe(403);
    expect(own.body.error.code).toBe('own_review');
    expect(own.body.error.message).toMatch(/nobody else .* may decide reviews.*invite a reviewer/);
  });
});

describe('revoking an approval', () => {
  it('only an approved review, only by a reviewer or admin, with a reason; audited and mailed', async () => {
    const batchId = await batchWithSixResults();
    const { body } = await submit(analyst.sessionId, batchId);
    const waiting = await revoke(reviewer.sessionId, body.reviewId, 'Not approved yet, so no.');
    expect(waiting.status).toBe(409);
    expect(waiting.body.error.code).toBe('not_approved');
    await decide(reviewer.sessionId, body.reviewId, approve);

    expect((await revoke(analyst.sessionId, body.reviewId, 'Analysts may not revoke.')).status).toBe(403);
    const noReason = await revoke(admin.sessionId, body.reviewId, 'no');
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields.reason).toMatch(/Say why/);

    const reason = 'The goniometer stage was found tilted by 2 degrees that week.';
    const revoked = await revoke(admin.sessionId, body.reviewId, reason);
    expect(revoked.status).toBe(200);
    expect(revoked.body).toEqual({ status: 'revoked' });

    const [row] = await getDb().select().from(reviews).where(eq(reviews.id, body.reviewId));
    expect(row).toMatchObject({ status: 'revoked', revokeReason: reason, revokedByUserId: admin.userId });
    expect(row.signature).not.toBeNull();
    expect(await statusesUnder(batchId)).toEqual(Array(6).fill('draft'));

    const audit = await getDb()
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.entityId, body.reviewId), eq(auditEvents.action, 'review.revoke')));
    expect(audit).toHaveLength(1);
    expect(audit[0].actorUserId).toBe(admin.userId);
    expect(audit[0].after).toMatchObject({ status: 'revoked', reason });
    expect(audit[0].before).toMatchObject({ status: 'approved' });

    const mails = await mailJobsTo(analyst.email);
    const revokedMail = mails.filter((m) => m.data.kind === 'review-revoked');
    expect(revokedMail).toHaveLength(1);
    expect(revokedMail[0].data.text).toContain(reason);

    // Revoked is final for this review; its results go to a new review.
    expect((await decide(reviewer.sessionId, body.reviewId, reject)).status).toBe(409);
    expect((await revoke(admin.sessionId, body.reviewId, reason)).body.error.code).toBe('not_approved');
    const again = await submit(analyst.sessionId, batchId);
    expect(again.status).toBe(201);
    expect(again.body.analysisCount).toBe(6);
    const open = await getDb()
      .select()
      .from(reviewItems)
      .where(and(inArray(reviewItems.reviewId, [body.reviewId, again.body.reviewId]), eq(reviewItems.open, true)));
    expect(open.every((i) => i.reviewId === again.body.reviewId)).toBe(true);
  });
});
