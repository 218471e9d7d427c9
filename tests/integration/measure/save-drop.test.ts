import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { analyses, auditEvents } from '@/db/schema';
import { GET, POST } from '@/app/api/photos/[id]/drop/route';
import { analyseDrop } from '@/lib/analysis';
import { decodeImageBytes } from '@/lib/analysis/node/decode';
import { and, eq } from 'drizzle-orm';
import { apiRequest } from '../support/request';
import { createMember, createOrganization } from '../support/fixtures';
import { insertPhotoWithBytes, labWithSample } from '../support/seed';

const FIXTURE = path.resolve(__dirname, '../../../fixtures/drops/cap-60-noisy.png');
let lab: { id: string };
let analyst: Awaited<ReturnType<typeof createMember>>;
let viewer: Awaited<ReturnType<typeof createMember>>;
let reviewer: Awaited<ReturnType<typeof createMember>>;
let sampleId: string;
let photoId: string;
let bytes: Buffer;

beforeAll(async () => {
  ({ lab, analyst, sampleId } = await labWithSample('T-1', 'L-1'));
  viewer = await createMember(lab.id, 'viewer');
  reviewer = await createMember(lab.id, 'reviewer');
  bytes = await readFile(FIXTURE);
  photoId = await insertPhotoWithBytes(lab.id, analyst.userId, bytes);
});

afterAll(async () => {
  await closeDb();
});

const save = (sessionId: string, body: Record<string, unknown>) =>
  POST(
    apiRequest(`/api/photos/${photoId}/drop`, { method: 'POST', sessionId, body }),
    { params: Promise.resolve({ id: photoId }) },
  );

describe('saving a drop analysis', () => {
  const baseline = { x1: 0, y1: 328, x2: 639, y2: 331 };

  it('stores exactly what lib/analysis gives for the same photo, method and baseline', async () => {
    const response = await save(analyst.sessionId, {
      sampleId,
      probeLiquidId: 'liquid-water',
      method: 'circle',
      baseline,
      expectedRevision: 0,
    });
    expect(response.status).toBe(201);
    const saved = await response.json();
    expect(saved.revision).toBe(1);
    const expected = await analyseDrop(await decodeImageBytes(bytes), { method: 'circle', baseline });
    expect(saved.result.leftDeg).toBe(expected.leftDeg);
    expect(saved.result.rightDeg).toBe(expected.rightDeg);
    expect(saved.result.baseline).toEqual(baseline);
  });

  it('a later save says why (400 naming `reason` without one) and keeps the reason with its revision', async () => {
    const body = { sampleId, probeLiquidId: 'liquid-water', method: 'young-laplace', baseline: null, expectedRevision: 1 };
    const unexplained = await save(analyst.sessionId, body);
    expect(unexplained.status).toBe(400);
    expect(Object.keys((await unexplained.json()).error.fields)).toEqual(['reason']);
    const second = await save(analyst.sessionId, { ...body, reason: 'Young–Laplace for a flattened drop' });
    expect((await second.json()).revision).toBe(2);
    const [row] = await getDb().select().from(analyses).where(and(eq(analyses.dropId, (await (await GET(apiRequest(`/api/photos/${photoId}/drop`, { sessionId: analyst.sessionId }), { params: Promise.resolve({ id: photoId }) })).json()).drop.id), eq(analyses.revision, 2)));
    expect(row.reason).toBe('Young–Laplace for a flattened drop');
  });

  it('every later save is a new revision; earlier ones are kept', async () => {
    const listed = await GET(apiRequest(`/api/photos/${photoId}/drop`, { sessionId: analyst.sessionId }), {
      params: Promise.resolve({ id: photoId }),
    });
    const { drop } = await listed.json();
    expect(drop.revisions.map((r: { revision: number }) => r.revision)).toEqual([2, 1]);
    expect(drop.revisions[1].method).toBe('circle');
    const audit = await getDb().select().from(auditEvents).where(eq(auditEvents.entityId, drop.id));
    expect(audit.map((a) => a.action)).toContain('drop.create');
  });

  it('refuses viewers and reviewers (403) and names a bad field (400)', async () => {
    for (const member of [viewer, reviewer]) {
      const refused = await save(member.sessionId, { sampleId, probeLiquidId: 'liquid-water', method: 'circle', baseline: null, expectedRevision: 2 });
      expect(refused.status).toBe(403);
    }
    const invalid = await save(analyst.sessionId, { sampleId: '', probeLiquidId: 'liquid-water', method: 'guess', baseline: null });
    expect(invalid.status).toBe(400);
    const body = await invalid.json();
    expect(Object.keys(body.error.fields)).toEqual(expect.arrayContaining(['sampleId', 'method']));
  });

  it('a sample of another organization is not found', async () => {
    const other = await createOrganization();
    const outsider = await createMember(other.id, 'analyst');
    const response = await save(outsider.sessionId, { sampleId, probeLiquidId: 'liquid-water', method: 'circle', baseline: null, expectedRevision: 0 });
    expect(response.status).toBe(404);
  });

  it('a stale save (based on an older revision) is refused with the current one; nothing is added', async () => {
    const body = { sampleId, probeLiquidId: 'liquid-water', method: 'circle', baseline: null };
    for (const expectedRevision of [0, 1]) {
      const stale = await save(analyst.sessionId, { ...body, expectedRevision });
      expect(stale.status).toBe(409);
      const reply = await stale.json();
      expect(reply.error.code).toBe('stale_revision');
      expect(reply.current).toEqual({ revision: 2 });
      expect(reply.error.message).toMatch(/reload revision 2/);
    }
    const missing = await save(analyst.sessionId, body);
    expect(missing.status).toBe(400);
    expect((await missing.json()).error.fields.expectedRevision).toMatch(/based on/);
    expect(await revisionsOfPhoto()).toEqual([2, 1]);
  });

  it('two simultaneous saves of one drop make exactly one revision; the other is told it is stale', async () => {
    const body = { sampleId, probeLiquidId: 'liquid-water', method: 'circle', baseline: null, expectedRevision: 2, reason: 'same drop, two tabs' };
    const replies = await Promise.all([save(analyst.sessionId, body), save(analyst.sessionId, body)]);
    expect(replies.map((r) => r.status).sort()).toEqual([201, 409]);
    const refused = await replies.find((r) => r.status === 409)!.json();
    expect(refused.error.code).toBe('stale_revision');
    expect(refused.current).toEqual({ revision: 3 });
    expect(await revisionsOfPhoto()).toEqual([3, 2, 1]);
  });
});

async function revisionsOfPhoto(): Promise<number[]> {
  const listed = await GET(apiRequest(`/api/photos/${photoId}/drop`, { sessionId: analyst.sessionId }), {
    params: Promise.resolve({ id: photoId }),
  });
  const { drop } = await listed.json();
  return drop.revisions.map((r: { revision: number }) => r.revision);
}
