import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { newId } from '@/db/queries/ids';
import { listUnsavedPhotos } from '@/db/queries/photos';
import { auditEvents, photos } from '@/db/schema';
import { POST as saveDrop } from '@/app/api/photos/[id]/drop/route';
import { POST as remove } from '@/app/api/photos/remove/route';
import { recordUploadedPhoto } from '@/server/photos/record-upload';
import { and, eq } from 'drizzle-orm';
import { apiRequest } from '../support/request';
import { createMember } from '../support/fixtures';
import * as seed from '../support/seed';

const FIXTURE = path.resolve(__dirname, '../../../fixtures/drops/cap-60-noisy.png');
let lab: { id: string };
let analyst: Awaited<ReturnType<typeof createMember>>;
let colleague: Awaited<ReturnType<typeof createMember>>;
let sampleId: string;
let bytes: Buffer;

beforeAll(async () => {
  ({ lab, analyst, sampleId } = await seed.labWithSample('W-1', 'W-L1'));
  colleague = await createMember(lab.id, 'analyst');
  bytes = await readFile(FIXTURE);
});

afterAll(async () => {
  await closeDb();
});

/** An upload of the fixture's bytes (a new stored file each time), as the upload route records a workspace photo. */
const upload = (userId: string, sha256: string, name = 'cap-60-noisy.png') =>
  recordUploadedPhoto(
    {
      organizationId: lab.id,
      uploadedByUserId: userId,
      fileKey: `test-${newId()}`,
      url: 'http://127.0.0.1:9/unused',
      originalName: name,
      sizeBytes: bytes.length,
      format: 'png',
      width: 640,
      height: 480,
      bitDepth: 8,
      sha256,
      thumbnailPng: bytes,
      workingPng: bytes,
    },
    { reuseUnsavedTwin: true },
  );

const removeAs = (sessionId: string, photoIds: string[]) =>
  remove(apiRequest('/api/photos/remove', { method: 'POST', sessionId, body: { photoIds } }), {
    params: Promise.resolve({}),
  });

const waiting = async (userId: string) =>
  (await listUnsavedPhotos(lab.id, userId)).map((p) => p.id);

describe("the user's unsaved photos", () => {
  it('the same file uploaded twice (also at once) is one photo; another user gets their own', async () => {
    const sha = `sha-${newId()}`;
    const [a, b] = await Promise.all([upload(analyst.userId, sha), upload(analyst.userId, sha)]);
    const again = await upload(analyst.userId, sha, 'renamed.png');
    expect(b.photoId).toBe(a.photoId);
    expect(again.photoId).toBe(a.photoId);
    // The later uploads say they are the kept photo, so their stored files are removed.
    expect([a, b].filter((r) => r.reused)).toHaveLength(1);
    expect(again.reused).toBe(true);
    const theirs = await upload(colleague.userId, sha);
    expect(theirs.photoId).not.toBe(a.photoId);
    const rows = await getDb().select().from(photos).where(eq(photos.sha256, sha));
    expect(rows).toHaveLength(2);
    expect((await waiting(analyst.userId)).filter((id) => id === a.photoId)).toHaveLength(1);
  });

  it('removes one or several of their own unsaved photos (audited); an upload of the same file brings one back', async () => {
    const first = await upload(analyst.userId, `sha-${newId()}`, 'one.png');
    const second = await upload(analyst.userId, `sha-${newId()}`, 'two.png');
    const response = await removeAs(analyst.sessionId, [first.photoId, second.photoId]);
    expect(response.status).toBe(200);
    expect((await response.json()).removed.sort()).toEqual([first.photoId, second.photoId].sort());
    const left = await waiting(analyst.userId);
    expect(left).not.toContain(first.photoId);
    expect(left).not.toContain(second.photoId);
    const audit = await getDb()
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, 'photo.remove'), eq(auditEvents.entityId, first.photoId)));
    expect(audit).toHaveLength(1);
    const [row] = await getDb().select().from(photos).where(eq(photos.id, first.photoId));
    const back = await upload(analyst.userId, row.sha256, 'one.png');
    expect(back.photoId).toBe(first.photoId);
    expect(await waiting(analyst.userId)).toContain(first.photoId);
  });

  it("refuses a saved photo or someone else's, and then removes none of the list", async () => {
    const mine = await upload(analyst.userId, `sha-${newId()}`, 'mine.png');
    const theirs = await upload(colleague.userId, `sha-${newId()}`, 'theirs.png');
    const refused = await removeAs(analyst.sessionId, [mine.photoId, theirs.photoId]);
    expect(refused.status).toBe(404);
    expect(await waiting(analyst.userId)).toContain(mine.photoId);
    expect(await waiting(colleague.userId)).toContain(theirs.photoId);

    const saved = await upload(analyst.userId, `sha-${newId()}`, 'saved.png');
    const response = await saveDrop(
      apiRequest(`/api/photos/${saved.photoId}/drop`, {
        method: 'POST',
        sessionId: analyst.sessionId,
        body: {
          sampleId,
          probeLiquidId: 'liquid-water',
          method: 'circle',
          baseline: null,
          expectedRevision: 0,
        },
      }),
      { params: Promise.resolve({ id: saved.photoId }) },
    );
    expect(response.status).toBe(201);
    expect((await removeAs(analyst.sessionId, [saved.photoId])).status).toBe(404);
    const [row] = await getDb().select().from(photos).where(eq(photos.id, saved.photoId));
    expect(row.removedAt).toBeNull();
  });

  it('refuses an empty list (400)', async () => {
    const response = await removeAs(analyst.sessionId, []);
    expect(response.status).toBe(400);
  });
});
