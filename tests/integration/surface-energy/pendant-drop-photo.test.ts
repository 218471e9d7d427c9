/**
 * Pendant drop from an uploaded photo: the route finds the outline in the organization's stored
 * photo, fits it, and keeps the photo with a saved result. Uploading itself is covered by
 * tests/integration/uploads and the e2e tests; here the photo rows are inserted as the upload
 * route's onStored would, with the bytes kept in the row (no upload service needed).
 */
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { newId } from '@/db/queries/ids';
import { listUnsavedPhotos } from '@/db/queries/photos';
import { recordUploadedPhoto } from '@/server/photos/record-upload';
import type { TensiometryOutputs } from '@/lib/contracts/tensiometry';
import { photos, tensiometryResults } from '@/db/schema';
import * as pendantRoute from '@/app/api/tensiometry/pendant-drop/route';
import * as listRoute from '@/app/api/tensiometry/route';
import { WATER_PENDANT, blankPhotoPng, pendantPhotoPng } from '../../support/pendant-photo';
import { createLab, type Lab } from '../records/helpers';
import { call } from './helpers';

const PATH = '/api/tensiometry/pendant-drop';
let lab: Lab;
let otherLab: Lab;
let dropPhotoId: string;
let blankPhotoId: string;
let otherLabPhotoId: string;

async function storePhoto(
  organizationId: string,
  userId: string,
  name: string,
  png: Buffer,
  purpose: 'sessile-drop' | 'pendant-drop' = 'pendant-drop',
) {
  const { photoId } = await recordUploadedPhoto({
    organizationId,
    uploadedByUserId: userId,
    fileKey: `test-${newId()}`,
    url: 'http://127.0.0.1:9/unused',
    originalName: name,
    sizeBytes: png.length,
    format: 'png',
    width: WATER_PENDANT.width,
    height: WATER_PENDANT.height,
    bitDepth: 8,
    sha256: 'test',
    thumbnailPng: png,
    workingPng: png,
    purpose,
  });
  return photoId;
}

beforeAll(async () => {
  lab = await createLab();
  otherLab = await createLab();
  const drop = await pendantPhotoPng(WATER_PENDANT);
  dropPhotoId = await storePhoto(lab.id, lab.members.analyst.userId, 'pendant-water.png', drop);
  // Uploaded as a sessile-drop photo, so the measurement workspace offers it.
  blankPhotoId = await storePhoto(
    lab.id,
    lab.members.analyst.userId,
    'blank.png',
    await blankPhotoPng(),
    'sessile-drop',
  );
  otherLabPhotoId = await storePhoto(
    otherLab.id,
    otherLab.members.analyst.userId,
    'pendant-water.png',
    drop,
  );
});

afterAll(async () => {
  await closeDb();
});

const body = (photoId: string, extra: Record<string, unknown> = {}) => ({
  photoId,
  needleOuterDiameterMm: WATER_PENDANT.needleOuterDiameterMm,
  densityDifferenceKgPerM3: WATER_PENDANT.densityDifferenceKgPerM3,
  ...extra,
});

describe('POST /api/tensiometry/pendant-drop with an uploaded photo', () => {
  it('is not offered by the measurement workspace as a drop photo waiting for a sample', async () => {
    const waiting = await listUnsavedPhotos(lab.id, lab.members.analyst.userId);
    expect(waiting.map((p) => p.id)).toEqual([blankPhotoId]);
  });

  it('finds the drop in the stored photo and recovers γ within 0.5 %', async () => {
    const response = await call(pendantRoute.POST, PATH, {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: body(dropPhotoId),
    });
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    const { result, extraction, photo, profile } = response.body;
    // Photo rendered from the Young–Laplace equation (Bashforth & Adams 1883) at γ = 72.0 mN/m,
    // Δρ = 997 kg/m³, b = 1.35 mm, 60 px/mm, needle 1.20 mm (tests/support/pendant-photo.ts).
    const gamma = WATER_PENDANT.surfaceTensionMilliNewtonPerM;
    expect(Math.abs(result.surfaceTensionMilliNewtonPerM - gamma) / gamma).toBeLessThan(0.005);
    expect(result.apexRadiusMm).toBeCloseTo(WATER_PENDANT.apexRadiusMm, 2);
    expect(result.rmsResidualPx).toBeLessThan(0.5);
    // The needle is 1.20 mm × 60 px/mm = 72 px wide.
    expect(extraction.needleOuterDiameterPx).toBeCloseTo(72, 0);
    expect(extraction.pointCount).toBeGreaterThan(100);
    expect(extraction.warnings).toEqual([]);
    expect(photo).toEqual({ id: dropPhotoId, width: 320, height: 360 });
    // The fitted outline reaches down to the rendered apex (330.6 px, pixel edges at whole
    // numbers, i.e. 330.1 with pixel centres at whole numbers).
    expect(profile.length).toBeGreaterThan(100);
    expect(Math.max(...profile.map((p: { y: number }) => p.y))).toBeCloseTo(330.1, 0);
    expect(response.body.saved).toBeUndefined();
  });

  it('saves the result with its photo, and lists it with photoId', async () => {
    const response = await call(pendantRoute.POST, PATH, {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: body(dropPhotoId, { save: true }),
    });
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    const { saved, result } = response.body;
    expect(saved.kind).toBe('pendant-drop');
    expect(saved.photoId).toBe(dropPhotoId);
    const [row] = await getDb()
      .select()
      .from(tensiometryResults)
      .where(eq(tensiometryResults.id, saved.id));
    expect(row.photoId).toBe(dropPhotoId);
    expect(row.organizationId).toBe(lab.id);
    expect(row.inputs).toEqual({
      photoId: dropPhotoId,
      needleOuterDiameterMm: 1.2,
      densityDifferenceKgPerM3: 997,
    });
    // A photo fit keeps what it found in the photo beside the result.
    const outputs = row.outputs as Extract<TensiometryOutputs, { extraction: unknown }>;
    expect(outputs.surfaceTensionMilliNewtonPerM).toBeCloseTo(
      result.surfaceTensionMilliNewtonPerM,
      12,
    );
    expect(outputs.extraction.needleOuterDiameterPx).toBeCloseTo(72, 0);

    // The measurement workspace never offers a hanging-drop photo as waiting for a sample.
    const waiting = await listUnsavedPhotos(lab.id, lab.members.analyst.userId);
    expect(waiting.map((p) => p.id)).not.toContain(dropPhotoId);
    expect(waiting.map((p) => p.id)).toContain(blankPhotoId);

    for (const [handler, path] of [
      [pendantRoute.GET, PATH],
      [listRoute.GET, '/api/tensiometry?kind=pendant-drop'],
    ] as const) {
      const list = await call(handler, path, { sessionId: lab.members.viewer.sessionId });
      expect(list.status).toBe(200);
      const item = list.body.items.find((i: { id: string }) => i.id === saved.id);
      expect(item.photoId).toBe(dropPhotoId);
    }
  });

  it('keeps a photo that a saved result uses', async () => {
    // No action on delete: the result stays checkable against its photo.
    const refused: unknown = await getDb()
      .delete(photos)
      .where(eq(photos.id, dropPhotoId))
      .then(
        () => null,
        (error: unknown) => error,
      );
    expect((refused as { cause?: Error } | null)?.cause?.message).toMatch(
      /tensiometry_results_photo_id_photos_id_fk/,
    );
  });

  it("answers 404 for another organization's photo or an unknown id", async () => {
    for (const photoId of [otherLabPhotoId, 'no-such-photo']) {
      const response = await call(pendantRoute.POST, PATH, {
        method: 'POST',
        sessionId: lab.members.analyst.sessionId,
        body: body(photoId, { save: true }),
      });
      expect(response.status).toBe(404);
      expect(response.body.error.code).toBe('not_found');
      expect(response.body.error.message).toMatch(/photo was not found/);
    }
    const rows = await getDb()
      .select()
      .from(tensiometryResults)
      .where(eq(tensiometryResults.photoId, otherLabPhotoId));
    expect(rows).toEqual([]);
  });

  it('refuses saving for a viewer (403) and fitting photos they may not see', async () => {
    const saving = await call(pendantRoute.POST, PATH, {
      method: 'POST',
      sessionId: lab.members.viewer.sessionId,
      body: body(dropPhotoId, { save: true }),
    });
    expect(saving.status).toBe(403);
    expect(saving.body.error.code).toBe('forbidden');
    expect(saving.body.error.message).toMatch(/save tensiometry results/);
    // Viewers read approved results only, not the drop photos (as /api/photos/[id]/image).
    const fitting = await call(pendantRoute.POST, PATH, {
      method: 'POST',
      sessionId: lab.members.viewer.sessionId,
      body: body(dropPhotoId),
    });
    expect(fitting.status).toBe(403);
    expect(fitting.body.error.message).toMatch(/fit drop photos/);
    // A reviewer sees the photos, so may fit one, but saves nothing.
    const reviewer = await call(pendantRoute.POST, PATH, {
      method: 'POST',
      sessionId: lab.members.reviewer.sessionId,
      body: body(dropPhotoId),
    });
    expect(reviewer.status).toBe(200);
  });

  it('answers 422 with what to do when the photo has no hanging drop', async () => {
    const response = await call(pendantRoute.POST, PATH, {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: body(blankPhotoId, { save: true }),
    });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('invalid_measurement');
    expect(response.body.error.message).toMatch(/no contrast.*use a backlit photo/);
    expect(response.body.error.fields.photoId).toBe(response.body.error.message);
    const rows = await getDb()
      .select()
      .from(tensiometryResults)
      .where(eq(tensiometryResults.photoId, blankPhotoId));
    expect(rows).toEqual([]);
  });

  it('says what to send when fields are missing or both forms are mixed', async () => {
    const missing = await call(pendantRoute.POST, PATH, {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: { photoId: dropPhotoId },
    });
    expect(missing.status).toBe(400);
    expect(Object.keys(missing.body.error.fields).sort()).toEqual([
      'densityDifferenceKgPerM3',
      'needleOuterDiameterMm',
    ]);
    expect(missing.body.error.fields.needleOuterDiameterMm).toMatch(/Enter the needle outer/);
    const both = await call(pendantRoute.POST, PATH, {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: body(dropPhotoId, { edge: [{ x: 1, y: 2 }] }),
    });
    expect(both.status).toBe(400);
    expect(both.body.error.fields.edge).toMatch(/either photoId .* or edge/);
    const empty = await call(pendantRoute.POST, PATH, {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: body(''),
    });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields.photoId).toMatch(/upload the photo first/);
  });
});
