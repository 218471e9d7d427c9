import { getDb } from '@/db/client';
import { ensureProbeLiquidLibrary } from '@/db/probe-liquid-library';
import { newId } from '@/db/queries/ids';
import { analyses, batches, coatings, drops, samples, specs } from '@/db/schema';
import { createMember, createOrganization } from './fixtures';

/*
 * Rows written straight into the database for tests that need records to exist (invented data).
 * Tests of the record routes themselves create records through the API (records/helpers.ts).
 */

type ReviewStatus = 'draft' | 'submitted' | 'approved' | 'rejected';

export async function insertCoating(
  organizationId: string,
  code: string,
  name = `Topcoat ${code}`,
) {
  const id = newId();
  await getDb().insert(coatings).values({ id, organizationId, code, name });
  return id;
}

/** A spec of the coating: water, each drop at least `minDeg`. */
export async function insertWaterSpec(organizationId: string, coatingId: string, minDeg: number) {
  await getDb().insert(specs).values({
    id: newId(),
    organizationId,
    coatingId,
    probeLiquidId: 'liquid-water',
    minDeg,
    scope: 'each-drop',
  });
}

export async function insertBatch(
  organizationId: string,
  coatingId: string,
  lotCode: string,
  producedOn = '2026-11-01',
) {
  const id = newId();
  await getDb().insert(batches).values({ id, organizationId, coatingId, lotCode, producedOn });
  return id;
}

export async function insertSample(
  organizationId: string,
  batchId: string,
  label: string,
  treatedAt: Date | null = null,
) {
  const id = newId();
  await getDb().insert(samples).values({ id, organizationId, batchId, label, treatedAt });
  return id;
}

/** One revision of a drop's angles read by hand: left/right default to the mean. */
export type Revision = {
  meanDeg: number;
  leftDeg?: number;
  rightDeg?: number;
  reviewStatus?: ReviewStatus;
};

/**
 * A drop read by hand (no photo, as an import makes it) with its analysis revisions 1…n, oldest
 * first; without revisions, a drop with no analysis yet.
 */
export async function insertDrop(
  organizationId: string,
  sampleId: string,
  options: {
    probeLiquidId?: string;
    sessionId?: string | null;
    measuredAt?: Date;
    revisions?: Revision[];
  } = {},
): Promise<string> {
  const db = getDb();
  const dropId = newId();
  await db.insert(drops).values({
    id: dropId,
    organizationId,
    sampleId,
    probeLiquidId: options.probeLiquidId ?? 'liquid-water',
    sessionId: options.sessionId ?? null,
    source: 'import',
    ...(options.measuredAt ? { measuredAt: options.measuredAt } : {}),
  });
  for (const [i, r] of (options.revisions ?? []).entries()) {
    const leftDeg = r.leftDeg ?? r.meanDeg;
    const rightDeg = r.rightDeg ?? r.meanDeg;
    await db.insert(analyses).values({
      id: newId(),
      organizationId,
      dropId,
      revision: i + 1,
      method: 'manual',
      result: { leftDeg, rightDeg, meanDeg: r.meanDeg, operator: 'test', note: '', importedRow: 0 },
      leftDeg,
      rightDeg,
      meanDeg: r.meanDeg,
      softwareVersion: 'test',
      reviewStatus: r.reviewStatus ?? 'draft',
    });
  }
  return dropId;
}

/**
 * A stored 640×480 PNG drop photo whose bytes are kept in the row (as for a TIFF's PNG copy), so
 * no upload service is needed.
 */
export async function insertPhotoWithBytes(
  organizationId: string,
  uploadedByUserId: string,
  bytes: Buffer,
): Promise<string> {
  const { recordUploadedPhoto } = await import('@/server/photos/record-upload');
  const { photoId } = await recordUploadedPhoto({
    organizationId,
    uploadedByUserId,
    fileKey: `test-${newId()}`,
    url: 'http://127.0.0.1:9/unused',
    originalName: 'drop.png',
    sizeBytes: bytes.length,
    format: 'png',
    width: 640,
    height: 480,
    bitDepth: 8,
    sha256: 'test',
    thumbnailPng: bytes,
    workingPng: bytes,
  });
  return photoId;
}

/**
 * Where the tests of saving drops start: a lab (the probe-liquid library in place) with an
 * analyst and one sample `S1` to save drops to, of a coating and batch of its own.
 */
export async function labWithSample(coatingCode: string, lotCode: string) {
  await ensureProbeLiquidLibrary(getDb());
  const lab = await createOrganization();
  const analyst = await createMember(lab.id, 'analyst');
  const batchId = await insertBatch(lab.id, await insertCoating(lab.id, coatingCode), lotCode);
  const sampleId = await insertSample(lab.id, batchId, 'S1');
  return { lab, analyst, sampleId };
}
