/** The comparison query, its CSV export and the dashboard queries against real PostgreSQL. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import { comparisonDrops, findComparisonCoating, loadComparison } from '@/db/queries/comparison';
import { outOfSpecBatches, pendingReviewCount, recentDrops } from '@/server/dashboard/load';
import { submitForReview } from '@/server/reviews/submit';
import * as exportRoute from '@/app/api/compare/drops.csv/route';
import { CSV_HEADER } from '@/lib/compare';
import { apiRequest } from '../support/request';
import { createLab, ensureLibrary, unique, type Lab } from '../records/helpers';
import * as seed from '../support/seed';

type Status = 'draft' | 'submitted' | 'approved' | 'rejected';

let lab: Lab;
let other: Lab;
let coatingId: string;
let coatingCode: string;
let batchOld: string;
let batchNew: string;
let lotOld: string;
let lotNew: string;
let otherBatch: string;
const dropIds: Record<string, string> = {};

const addCoating = (orgId: string, code: string) => seed.insertCoating(orgId, code);
const addBatch = seed.insertBatch;
const addSample = (orgId: string, batchId: string, label: string) =>
  seed.insertSample(orgId, batchId, label, new Date('2026-03-01T08:00:00Z'));

/** A drop with one analysis per [meanDeg, status] given (left/right 1° either side), revision 1, 2, … */
const addDrop = (
  orgId: string,
  sampleId: string,
  revisions: [number, Status][],
  measuredAt: string,
) =>
  seed.insertDrop(orgId, sampleId, {
    measuredAt: new Date(measuredAt),
    revisions: revisions.map(([meanDeg, reviewStatus]) => ({
      meanDeg,
      leftDeg: meanDeg - 1,
      rightDeg: meanDeg + 1,
      reviewStatus,
    })),
  });

beforeAll(async () => {
  await ensureLibrary();
  lab = await createLab();
  other = await createLab();
  coatingCode = unique('CMP');
  coatingId = await addCoating(lab.id, coatingCode);
  await seed.insertWaterSpec(lab.id, coatingId, 100);
  lotOld = unique('B');
  lotNew = unique('B');
  batchOld = await addBatch(lab.id, coatingId, lotOld, '2026-03-01');
  batchNew = await addBatch(lab.id, coatingId, lotNew, '2026-03-08');
  const sOld = await addSample(lab.id, batchOld, 'P1');
  const sNew = await addSample(lab.id, batchNew, 'P1');
  // Old batch: three approved drops, the first re-analysed (rev 2 replaces rev 1).
  dropIds.reanalysed = await addDrop(
    lab.id,
    sOld,
    [
      [90, 'approved'],
      [110, 'approved'],
    ],
    '2026-03-02T10:00:00Z',
  );
  dropIds.old2 = await addDrop(lab.id, sOld, [[111, 'approved']], '2026-03-02T10:01:00Z');
  dropIds.old3 = await addDrop(lab.id, sOld, [[112, 'approved']], '2026-03-02T10:02:00Z');
  // New batch: one draft, one submitted, one approved then re-analysed as a draft, one approved.
  dropIds.draft = await addDrop(lab.id, sNew, [[98, 'draft']], '2026-03-09T10:00:00Z');
  dropIds.submitted = await addDrop(lab.id, sNew, [[99, 'submitted']], '2026-03-09T10:01:00Z');
  dropIds.supersededApproval = await addDrop(
    lab.id,
    sNew,
    [
      [104, 'approved'],
      [97, 'draft'],
    ],
    '2026-03-09T10:02:00Z',
  );
  dropIds.newApproved = await addDrop(lab.id, sNew, [[105, 'approved']], '2026-03-09T10:03:00Z');
  // Another organization with a batch of the same coating code.
  const otherCoating = await addCoating(other.id, coatingCode);
  otherBatch = await addBatch(other.id, otherCoating, unique('B'), '2026-03-05');
  await addDrop(
    other.id,
    await addSample(other.id, otherBatch, 'P1'),
    [[150, 'approved']],
    '2026-03-06T10:00:00Z',
  );
});

afterAll(async () => {
  await closeDb();
});

describe('comparison query', () => {
  it('returns the latest revision of every drop', async () => {
    const rows = await comparisonDrops(lab.id, [batchOld, batchNew], { visibility: 'all' });
    expect(rows).toHaveLength(7);
    const reanalysed = rows.find((r) => r.dropId === dropIds.reanalysed);
    expect(reanalysed?.revision).toBe(2);
    expect(reanalysed?.meanDeg).toBe(110);
    expect(reanalysed?.leftDeg).toBe(109);
    expect(rows.find((r) => r.dropId === dropIds.supersededApproval)?.meanDeg).toBe(97);
    // Production order: the old batch first.
    expect(rows.slice(0, 3).every((r) => r.batchId === batchOld)).toBe(true);
  });

  it('gives roles without results:read-all only drops whose latest revision is approved', async () => {
    const rows = await comparisonDrops(lab.id, [batchOld, batchNew], { visibility: 'approved' });
    expect(rows.map((r) => r.dropId).sort()).toEqual(
      [dropIds.reanalysed, dropIds.old2, dropIds.old3, dropIds.newApproved].sort(),
    );
    expect(rows.every((r) => r.reviewStatus === 'approved')).toBe(true);
  });

  it('keeps organizations apart', async () => {
    expect(await comparisonDrops(lab.id, [otherBatch], { visibility: 'all' })).toEqual([]);
    expect(await comparisonDrops(other.id, [batchOld], { visibility: 'all' })).toEqual([]);
    const mine = await findComparisonCoating(lab.id, coatingCode);
    const theirs = await findComparisonCoating(other.id, coatingCode);
    expect(mine?.id).toBe(coatingId);
    expect(theirs?.id).not.toBe(coatingId);
    expect(await findComparisonCoating(other.id, coatingId)).toBeNull();
    const data = await loadComparison(other.id, coatingId, { visibility: 'all' });
    expect(data.batches).toEqual([]);
    expect(data.drops).toEqual([]);
  });

  it('loads the chosen batches by lot code, with the specs and liquids', async () => {
    const data = await loadComparison(lab.id, coatingId, {
      batches: [lotNew],
      visibility: 'all',
    });
    expect(data.batches.map((b) => b.lotCode)).toEqual([lotNew]);
    expect(data.allBatches.map((b) => b.lotCode)).toEqual([lotNew, lotOld]);
    expect(data.drops).toHaveLength(4);
    expect(data.specs).toHaveLength(1);
    expect(data.liquids.map((l) => l.id)).toEqual(['liquid-water']);
  });
});

async function exportCsv(sessionId: string, query: string) {
  const response = await exportRoute.GET(
    apiRequest(`/api/compare/drops.csv?${query}`, { sessionId }),
    {},
  );
  return { response, text: await response.text() };
}

describe('CSV export of the raw drops', () => {
  it('writes a UTF-8 header with units and one row per drop', async () => {
    const { response, text } = await exportCsv(
      lab.members.analyst.sessionId,
      `coating=${coatingCode}`,
    );
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(response.headers.get('content-disposition')).toContain('attachment');
    const lines = text
      .replace(/^\uFEFF/, '')
      .trimEnd()
      .split('\r\n');
    expect(lines[0]).toBe(CSV_HEADER.join(','));
    expect(lines[0]).toContain('Left angle (°)');
    expect(lines[0]).toContain('Mean angle (°)');
    expect(lines).toHaveLength(1 + 7);
    const reanalysed = lines.find((l) => l.includes(dropIds.reanalysed))?.split(',');
    expect(reanalysed?.slice(-4)).toEqual(['1.08', '109.000', '111.000', '110.000']);
    expect(reanalysed?.[6]).toBe('2');
  });

  it('applies the batch filter', async () => {
    const { text } = await exportCsv(
      lab.members.admin.sessionId,
      `coating=${coatingId}&batches=${lotOld}`,
    );
    expect(text.trimEnd().split('\r\n')).toHaveLength(1 + 3);
  });

  it('is refused to viewers, who may not export', async () => {
    const { response, text } = await exportCsv(
      lab.members.viewer.sessionId,
      `coating=${coatingCode}`,
    );
    expect(response.status).toBe(403);
    expect(JSON.parse(text).error.code).toBe('forbidden');
  });

  it("does not export another organization's coating", async () => {
    const { response } = await exportCsv(other.members.analyst.sessionId, `coating=${coatingId}`);
    expect(response.status).toBe(404);
  });

  it('asks for a coating when none is given', async () => {
    const { response, text } = await exportCsv(lab.members.analyst.sessionId, '');
    expect(response.status).toBe(400);
    expect(JSON.parse(text).error.fields.coating).toBeTruthy();
  });
});

describe('dashboard queries', () => {
  it('lists recent drops newest first, approved only for viewers', async () => {
    const all = await recentDrops(lab.id, { visibility: 'all' });
    expect(all[0].dropId).toBe(dropIds.newApproved);
    expect(all).toHaveLength(7);
    const approved = await recentDrops(lab.id, { visibility: 'approved' });
    expect(approved.map((d) => d.dropId)).toEqual([
      dropIds.newApproved,
      dropIds.old3,
      dropIds.old2,
      dropIds.reanalysed,
    ]);
  });

  it('counts review requests waiting for a decision, not drops', async () => {
    // A drop marked submitted without a review request is not a request.
    expect(await pendingReviewCount(lab.id)).toBe(0);
    const analyst = lab.members.analyst;
    const { analysisCount } = await submitForReview(
      { organizationId: lab.id, userId: analyst.userId },
      { batchId: batchNew, note: '' },
    );
    // One request covering several drops counts once.
    expect(analysisCount).toBeGreaterThan(1);
    expect(await pendingReviewCount(lab.id)).toBe(1);
    expect(await pendingReviewCount(other.id)).toBe(0);
  });

  it('lists batches that fail their spec', async () => {
    const out = await outOfSpecBatches(lab.id, { visibility: 'all' });
    // New batch: 98°, 99° and 97° are below the 100° each-drop limit.
    expect(out.map((b) => b.lotCode)).toEqual([lotNew]);
    expect(out[0].rule).toContain('each drop ≥ 100°');
    // Viewers: only the approved 105° drop — one drop is not enough data, not a fail.
    expect(await outOfSpecBatches(lab.id, { visibility: 'approved' })).toEqual([]);
  });
});
