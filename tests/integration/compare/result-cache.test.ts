/**
 * Comparisons and the dashboard's out-of-spec list are cached under the organization's data
 * version (server/cache/results.ts, migration 0018). Every write below goes straight to the
 * database, as another web instance's would, so only the version can tell this process that the
 * data changed.
 */
import { eq, inArray, sql } from 'drizzle-orm';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { organizationDataVersion } from '@/db/queries/data-version';
import { analyses, batches, specs } from '@/db/schema';
import type { OrgContext } from '@/lib/auth/context';
import type { Role } from '@/lib/auth/permissions';
import { clearResultCache } from '@/server/cache/results';
import { exportComparisonDrops, loadComparePage } from '@/server/compare/load';
import { outOfSpecBatches } from '@/server/dashboard/load';
import { createLab, ensureLibrary, unique, type Lab } from '../records/helpers';
import * as seed from '../support/seed';

let lab: Lab;
let other: Lab;
let coatingId: string;
let coatingCode: string;
let batchId: string;
let lotCode: string;
let sampleId: string;

function ctxOf(role: Role): OrgContext {
  const m = lab.members[role];
  return {
    user: { id: m.userId, email: m.email, name: `Test ${role}` },
    sessionId: m.sessionId,
    organization: { id: lab.id, name: 'Cache lab', role },
    memberships: [],
  };
}

const comparePage = (role: Role) =>
  loadComparePage(ctxOf(role), { coating: coatingCode, batches: [], ref: null });
const csvLines = async (role: Role) =>
  (await exportComparisonDrops(ctxOf(role), { coating: coatingCode, batches: [], ref: null })).csv
    .trim()
    .split('\n');
const outOfSpecLots = async (visibility: 'all' | 'approved') =>
  (await outOfSpecBatches(lab.id, { visibility })).map((b) => b.lotCode);

beforeAll(async () => {
  await ensureLibrary();
  lab = await createLab();
  other = await createLab();
  coatingCode = unique('RC');
  coatingId = await seed.insertCoating(lab.id, coatingCode);
  await seed.insertWaterSpec(lab.id, coatingId, 100);
  lotCode = unique('B');
  batchId = await seed.insertBatch(lab.id, coatingId, lotCode, '2026-04-01');
  sampleId = await seed.insertSample(lab.id, batchId, 'P1');
  for (const meanDeg of [110, 111, 112]) {
    await seed.insertDrop(lab.id, sampleId, { revisions: [{ meanDeg, reviewStatus: 'approved' }] });
  }
});

beforeEach(() => clearResultCache());

afterAll(async () => {
  await closeDb();
});

describe('the organization data version', () => {
  it('moves on when a drop, an analysis, a spec or a batch changes, and only for its organization', async () => {
    const steps: [string, () => Promise<unknown>][] = [
      ['a new drop', () => seed.insertDrop(lab.id, sampleId, { revisions: [{ meanDeg: 109 }] })],
      [
        'a review decision',
        () =>
          getDb()
            .update(analyses)
            .set({ reviewStatus: 'approved' })
            .where(eq(analyses.organizationId, lab.id)),
      ],
      [
        'a spec change',
        () => getDb().update(specs).set({ minDeg: 101 }).where(eq(specs.coatingId, coatingId)),
      ],
      [
        'a batch edit',
        () => getDb().update(batches).set({ notes: 'checked' }).where(eq(batches.id, batchId)),
      ],
    ];
    for (const [what, change] of steps) {
      const before = await organizationDataVersion(lab.id);
      const theirs = await organizationDataVersion(other.id);
      await change();
      expect(await organizationDataVersion(lab.id), what).toBeGreaterThan(before);
      expect(await organizationDataVersion(other.id), what).toBe(theirs);
    }
  });

  it('moves once per transaction, at commit, and not at all when it rolls back', async () => {
    const before = await organizationDataVersion(lab.id);
    await getDb().transaction(async (tx) => {
      await tx.update(specs).set({ note: 'one' }).where(eq(specs.coatingId, coatingId));
      await tx.update(batches).set({ notes: 'two' }).where(eq(batches.id, batchId));
      // Deferred: not yet inside the transaction that made the change.
      expect(await organizationDataVersion(lab.id, tx)).toBe(before);
    });
    const after = await organizationDataVersion(lab.id);
    expect(after).toBeGreaterThan(before);
    await expect(
      getDb().transaction(async (tx) => {
        await tx.update(specs).set({ note: 'three' }).where(eq(specs.coatingId, coatingId));
        throw new Error('roll back');
      }),
    ).rejects.toThrow('roll back');
    expect(await organizationDataVersion(lab.id)).toBe(after);
  });

  it('does not move when data is only read', async () => {
    const before = await organizationDataVersion(lab.id);
    await comparePage('analyst');
    await getDb().execute(sql`select count(*) from drops where organization_id = ${lab.id}`);
    expect(await organizationDataVersion(lab.id)).toBe(before);
  });
});

describe('cached comparisons', () => {
  it('serve the same result while the data is unchanged', async () => {
    const first = await comparePage('analyst');
    const second = await comparePage('analyst');
    expect(second.comparison).toBe(first.comparison);
    expect(second.data).toBe(first.data);
  });

  it('show a new drop, its review decision and a spec change at once', async () => {
    const before = await comparePage('analyst');
    const lines = await csvLines('analyst');
    const dropId = await seed.insertDrop(lab.id, sampleId, { revisions: [{ meanDeg: 95 }] });

    const withDrop = await comparePage('analyst');
    expect(withDrop.data!.drops.length).toBe(before.data!.drops.length + 1);
    expect(await csvLines('analyst')).toHaveLength(lines.length + 1);
    const row = () => csvLines('analyst').then((all) => all.find((l) => l.includes(dropId)));
    expect(await row()).toMatch(/draft/);

    await getDb()
      .update(analyses)
      .set({ reviewStatus: 'rejected' })
      .where(eq(analyses.dropId, dropId));
    expect(await row()).toMatch(/rejected/);

    const rule = async () =>
      (await comparePage('analyst')).comparison!.liquids[0]!.specs[0]!.minDeg;
    await getDb().update(specs).set({ minDeg: 90 }).where(eq(specs.coatingId, coatingId));
    expect(await rule()).toBe(90);
    await getDb().update(specs).set({ minDeg: 100 }).where(eq(specs.coatingId, coatingId));
    expect(await rule()).toBe(100);
  });

  it('never give a viewer what was computed for a role that sees drafts', async () => {
    const failing = unique('B');
    const failingBatch = await seed.insertBatch(lab.id, coatingId, failing, '2026-04-02');
    const failingSample = await seed.insertSample(lab.id, failingBatch, 'P1');
    // Three drops, as a verdict needs (fewer are "not enough data").
    const dropIds: string[] = [];
    for (const meanDeg of [60, 61, 62]) {
      dropIds.push(await seed.insertDrop(lab.id, failingSample, { revisions: [{ meanDeg }] }));
    }
    const dropId = dropIds[0]!;

    // The analyst's view is computed first and cached; the viewer's must not come from it.
    expect(await outOfSpecLots('all')).toContain(failing);
    const analystPage = await comparePage('analyst');
    expect(analystPage.data!.drops.some((d) => d.dropId === dropId)).toBe(true);
    expect(await outOfSpecLots('approved')).not.toContain(failing);
    const viewerPage = await comparePage('viewer');
    expect(viewerPage.data!.drops.some((d) => d.dropId === dropId)).toBe(false);
    expect(viewerPage.data!.drops.every((d) => d.reviewStatus === 'approved')).toBe(true);

    // Approved (by a reviewer, here straight in the database): the viewer sees it now.
    await getDb()
      .update(analyses)
      .set({ reviewStatus: 'approved' })
      .where(inArray(analyses.dropId, dropIds));
    expect(await outOfSpecLots('approved')).toContain(failing);
    expect((await comparePage('viewer')).data!.drops.some((d) => d.dropId === dropId)).toBe(true);

    // A newer draft revision hides it from the viewer again.
    await getDb()
      .insert(analyses)
      .values({
        id: unique('an'),
        organizationId: lab.id,
        dropId,
        revision: 2,
        method: 'manual',
        result: {
          leftDeg: 61,
          rightDeg: 61,
          meanDeg: 61,
          operator: 'test',
          note: '',
          importedRow: 0,
        },
        leftDeg: 61,
        rightDeg: 61,
        meanDeg: 61,
        softwareVersion: 'test',
        reviewStatus: 'draft',
      });
    expect((await comparePage('viewer')).data!.drops.some((d) => d.dropId === dropId)).toBe(false);
    expect(
      (await comparePage('analyst')).data!.drops.find((d) => d.dropId === dropId)?.meanDeg,
    ).toBe(61);

    // Archived: gone from both.
    await getDb()
      .update(batches)
      .set({ archivedAt: new Date() })
      .where(eq(batches.id, failingBatch));
    expect(await outOfSpecLots('all')).not.toContain(failing);
  });
});
