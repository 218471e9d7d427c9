/**
 * Saving a dynamic measurement: the server re-analyses the stored source (frame photos, or a video
 * stored through the upload service) in a worker thread and keeps what lib/dynamic computes.
 * The source is the committed needle-in series (fixtures/series/needle-in): every frame an exact
 * Young–Laplace profile rendered by fixtures/generator (Bashforth & Adams 1883; REFERENCES.md),
 * grown through the needle at a known advancing angle of 108° and withdrawn at a receding angle
 * of 83° — the generator's truth, checked within 0.5° as issue 16 asks.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import { UTApi, UTFile } from 'uploadthing/server';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { ensureProbeLiquidLibrary } from '@/db/probe-liquid-library';
import { newId } from '@/db/queries/ids';
import { auditEvents, batches, coatings, dynamicAnalyses, samples } from '@/db/schema';
import { POST } from '@/app/api/dynamic-measurements/route';
import { GET } from '@/app/api/dynamic-measurements/[id]/route';
import { recordUploadedPhoto } from '@/server/photos/record-upload';
import { recordUploadedVideo } from '@/server/dynamic/record-video';
import { utapiOptions } from '@/lib/uploads/config';
import { decodeImageFile } from '@/lib/analysis/node/decode';
import { writeVideo } from '@/fixtures/generator/series-video';
import { apiRequest } from '../support/request';
import { createMember, createOrganization } from '../support/fixtures';

const ROOT = path.resolve(__dirname, '../../..');
const SERIES = path.join(ROOT, 'fixtures/series/needle-in');
const manifest = JSON.parse(readFileSync(path.join(SERIES, 'manifest.json'), 'utf8')) as {
  fps: number;
  frameCount: number;
  expected: { advancingDeg: number; recedingDeg: number; hysteresisDeg: number };
  frames: { file: string }[];
};

let lab: { id: string };
let otherLab: { id: string };
let analyst: Awaited<ReturnType<typeof createMember>>;
let viewer: Awaited<ReturnType<typeof createMember>>;
let sampleId: string;
let photoIds: string[];
let foreignPhotoId: string;

async function recordFrame(organizationId: string, userId: string, file: string) {
  const bytes = readFileSync(path.join(SERIES, file));
  // The bytes are kept in the row (as for a TIFF's PNG copy), so the frames need no upload service.
  const { photoId } = await recordUploadedPhoto({
    organizationId,
    uploadedByUserId: userId,
    fileKey: `test-${newId()}`,
    url: 'http://127.0.0.1:9/unused',
    originalName: file,
    sizeBytes: bytes.length,
    format: 'png',
    width: 320,
    height: 240,
    bitDepth: 8,
    sha256: 'test',
    thumbnailPng: bytes,
    workingPng: bytes,
    purpose: 'series-frame',
  });
  return photoId;
}

beforeAll(async () => {
  const db = getDb();
  await ensureProbeLiquidLibrary(db);
  lab = await createOrganization();
  otherLab = await createOrganization();
  analyst = await createMember(lab.id, 'analyst');
  viewer = await createMember(lab.id, 'viewer');
  const outsider = await createMember(otherLab.id, 'analyst');
  const coatingId = newId();
  const batchId = newId();
  sampleId = newId();
  await db
    .insert(coatings)
    .values({ id: coatingId, organizationId: lab.id, code: 'DYN-1', name: 'Easy-clean' });
  await db
    .insert(batches)
    .values({
      id: batchId,
      organizationId: lab.id,
      coatingId,
      lotCode: 'DYN-L1',
      producedOn: '2026-11-01',
    });
  await db.insert(samples).values({ id: sampleId, organizationId: lab.id, batchId, label: 'S1' });
  photoIds = [];
  for (const frame of manifest.frames)
    photoIds.push(await recordFrame(lab.id, analyst.userId, frame.file));
  foreignPhotoId = await recordFrame(otherLab.id, outsider.userId, manifest.frames[0].file);
});

afterAll(async () => {
  await closeDb();
});

const save = (sessionId: string, body: Record<string, unknown>) =>
  POST(apiRequest('/api/dynamic-measurements', { method: 'POST', sessionId, body }), {
    params: Promise.resolve({}),
  });

const needleIn = (source: Record<string, unknown>, extra: Record<string, unknown> = {}) => ({
  sampleId,
  probeLiquidId: 'liquid-water',
  kind: 'grow-and-withdraw',
  method: 'young-laplace',
  source,
  ...extra,
});

describe('saving a dynamic measurement', () => {
  let measurementId: string;

  it('re-analyses frame photos on the server and keeps advancing and receding within 0.5° of the generator', async () => {
    const response = await save(
      analyst.sessionId,
      needleIn({ type: 'frames', photoIds, fps: manifest.fps }),
    );
    expect(response.status).toBe(201);
    const saved = await response.json();
    expect(saved.revision).toBe(1);
    measurementId = saved.measurementId;
    const { advancing, receding, hysteresisDeg, frameCount } = saved.result;
    expect(frameCount).toBe(manifest.frameCount);
    expect(Math.abs(advancing.meanDeg - manifest.expected.advancingDeg)).toBeLessThan(0.5);
    expect(Math.abs(receding.meanDeg - manifest.expected.recedingDeg)).toBeLessThan(0.5);
    expect(Math.abs(hysteresisDeg - manifest.expected.hysteresisDeg)).toBeLessThan(0.5);
    expect(advancing.frameCount).toBeGreaterThanOrEqual(3);
    expect(advancing.sdDeg).toBeGreaterThanOrEqual(0);

    const [row] = await getDb()
      .select()
      .from(dynamicAnalyses)
      .where(eq(dynamicAnalyses.id, saved.analysisId));
    expect(row.advancingDeg).toBeCloseTo(advancing.meanDeg, 9);
    expect(row.recedingDeg).toBeCloseTo(receding.meanDeg, 9);
    expect(row.advancingFrames).toBe(advancing.frameCount);
    expect(row.series).toHaveLength(manifest.frameCount);
    const audit = await getDb()
      .select({ action: auditEvents.action })
      .from(auditEvents)
      .where(and(eq(auditEvents.organizationId, lab.id), eq(auditEvents.entityId, measurementId)));
    expect(audit.map((a) => a.action)).toEqual(['dynamic.create']);
  });

  it('adds a revision when the user moves a window, and the numbers follow the window', async () => {
    const response = await save(
      analyst.sessionId,
      needleIn(
        { type: 'frames', photoIds, fps: manifest.fps },
        { measurementId, windows: { receding: null } },
      ),
    );
    expect(response.status).toBe(201);
    const saved = await response.json();
    expect(saved.revision).toBe(2);
    expect(saved.result.receding).toBeNull();
    expect(saved.result.hysteresisDeg).toBeNull();

    const read = await GET(
      apiRequest(`/api/dynamic-measurements/${measurementId}`, { sessionId: analyst.sessionId }),
      {
        params: Promise.resolve({ id: measurementId }),
      },
    );
    expect(read.status).toBe(200);
    const body = await read.json();
    expect(body.revisions.map((r: { revision: number }) => r.revision)).toEqual([2, 1]);
    expect(body.series).toHaveLength(manifest.frameCount);
  });

  it('re-analyses a video stored through the upload service (MP4/H.264)', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'beadline-dyn-'));
    const file = path.join(dir, 'needle-in.mp4');
    const frames = await Promise.all(
      manifest.frames.map((f) => decodeImageFile(path.join(SERIES, f.file))),
    );
    await writeVideo(frames, file, manifest.fps, 'mp4');
    const [uploaded] = await new UTApi(utapiOptions()).uploadFiles([
      new UTFile([readFileSync(file)], 'needle-in.mp4', { type: 'video/mp4' }),
    ]);
    expect(uploaded.error).toBeNull();
    const { videoId, info } = await recordUploadedVideo(
      { organizationId: lab.id, userId: analyst.userId },
      {
        key: uploaded.data!.key,
        url: uploaded.data!.ufsUrl,
        name: 'needle-in.mp4',
        size: uploaded.data!.size,
      },
    );
    expect(info).toMatchObject({ codec: 'h264', width: 320, height: 240, fps: manifest.fps });

    const response = await save(analyst.sessionId, needleIn({ type: 'video', videoId }));
    expect(response.status).toBe(201);
    const saved = await response.json();
    expect(Math.abs(saved.result.advancing.meanDeg - manifest.expected.advancingDeg)).toBeLessThan(
      0.5,
    );
    expect(Math.abs(saved.result.receding.meanDeg - manifest.expected.recedingDeg)).toBeLessThan(
      0.5,
    );
  });

  it('refuses a viewer, a frame of another organization, and a revision of another source', async () => {
    const source = { type: 'frames', photoIds, fps: manifest.fps };
    expect((await save(viewer.sessionId, needleIn(source))).status).toBe(403);

    const foreign = await save(
      analyst.sessionId,
      needleIn({
        type: 'frames',
        photoIds: [foreignPhotoId, ...photoIds.slice(1)],
        fps: manifest.fps,
      }),
    );
    expect(foreign.status).toBe(404);
    expect((await foreign.json()).error.fields).toHaveProperty('source');

    const other = await save(
      analyst.sessionId,
      needleIn(
        { type: 'frames', photoIds: photoIds.slice(0, 10), fps: manifest.fps },
        { measurementId },
      ),
    );
    expect(other.status).toBe(400);
    expect((await other.json()).error.code).toBe('invalid_input');

    const noTilt = await save(analyst.sessionId, needleIn(source, { kind: 'tilt' }));
    expect(noTilt.status).toBe(400);
    expect((await noTilt.json()).error.fields).toHaveProperty('tilt');
  });
});
