import 'server-only';
import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import { getDb } from '../client';
import { drops, photos } from '../schema';
import type { Executor } from './transaction';

export type NewPhoto = {
  organizationId: string;
  uploadedByUserId: string;
  fileKey: string;
  url: string;
  originalName: string;
  sizeBytes: number;
  format: string;
  width: number;
  height: number;
  bitDepth: number;
  sha256: string;
  thumbnailPng: Buffer;
  workingPng: Buffer | null;
  /** Sessile drop (the default) or hanging drop. */
  purpose?: 'sessile-drop' | 'pendant-drop' | 'series-frame';
};

export async function insertPhoto(db: Executor, row: NewPhoto & { id: string }): Promise<void> {
  await db.insert(photos).values(row);
}

const photoSummaryColumns = {
  id: photos.id,
  originalName: photos.originalName,
  format: photos.format,
  width: photos.width,
  height: photos.height,
  bitDepth: photos.bitDepth,
  sizeBytes: photos.sizeBytes,
  sha256: photos.sha256,
  createdAt: photos.createdAt,
  uploadedByUserId: photos.uploadedByUserId,
};

export type PhotoSummary = {
  id: string;
  originalName: string;
  format: string;
  width: number;
  height: number;
  bitDepth: number;
  sizeBytes: number;
  sha256: string;
  createdAt: Date;
  uploadedByUserId: string | null;
};

export async function getPhoto(
  organizationId: string,
  photoId: string,
): Promise<PhotoSummary | null> {
  const rows = await getDb()
    .select(photoSummaryColumns)
    .from(photos)
    .where(and(eq(photos.organizationId, organizationId), eq(photos.id, photoId)))
    .limit(1);
  return rows[0] ?? null;
}

/** Where the bytes are: the stored original's URL and, when kept, the browser-friendly PNG. */
export async function getPhotoSource(organizationId: string, photoId: string) {
  const rows = await getDb()
    .select({ url: photos.url, format: photos.format, workingPng: photos.workingPng })
    .from(photos)
    .where(and(eq(photos.organizationId, organizationId), eq(photos.id, photoId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function getPhotoThumbnail(organizationId: string, photoId: string) {
  const rows = await getDb()
    .select({ thumbnailPng: photos.thumbnailPng, sha256: photos.sha256 })
    .from(photos)
    .where(and(eq(photos.organizationId, organizationId), eq(photos.id, photoId)))
    .limit(1);
  return rows[0] ?? null;
}

/**
 * Photos this user uploaded that are not saved to a sample yet: the workspace's strip after a
 * reload. Photos of hanging drops (uploaded for the pendant-drop surface tension) are not offered.
 */
export async function listUnsavedPhotos(organizationId: string, userId: string, limit = 50) {
  return getDb()
    .select(photoSummaryColumns)
    .from(photos)
    .leftJoin(drops, and(eq(drops.photoId, photos.id), isNull(drops.archivedAt)))
    .where(
      and(
        eq(photos.organizationId, organizationId),
        eq(photos.uploadedByUserId, userId),
        isNull(drops.id),
        isNull(photos.removedAt),
        eq(photos.purpose, 'sessile-drop'),
      ),
    )
    .orderBy(desc(photos.createdAt))
    .limit(limit);
}

/** No live drop was saved from the photo. */
const noLiveDrop = sql`not exists (select 1 from ${drops} where ${drops.photoId} = ${photos.id} and ${drops.archivedAt} is null)`;

/**
 * The user's photo with these bytes and purpose that is not saved to a sample (removed ones
 * included), if any: an upload of the same file again is that photo, not a second one.
 */
export async function findUnsavedTwin(
  db: Executor,
  input: {
    organizationId: string;
    userId: string;
    sha256: string;
    purpose: NonNullable<NewPhoto['purpose']>;
  },
): Promise<{ id: string; removedAt: Date | null } | null> {
  const [row] = await db
    .select({ id: photos.id, removedAt: photos.removedAt })
    .from(photos)
    .where(
      and(
        eq(photos.organizationId, input.organizationId),
        eq(photos.uploadedByUserId, input.userId),
        eq(photos.sha256, input.sha256),
        eq(photos.purpose, input.purpose),
        noLiveDrop,
      ),
    )
    .orderBy(asc(photos.createdAt))
    .limit(1);
  return row ?? null;
}

/** Serialises uploads of the same file by the same user, so two at once still make one photo. */
export async function lockUploadsOf(tx: Executor, userId: string, sha256: string): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`${userId}:${sha256}`}))`);
}

/** Puts a removed photo back in its uploader's workspace. */
export async function restorePhoto(db: Executor, photoId: string): Promise<void> {
  await db.update(photos).set({ removedAt: null }).where(eq(photos.id, photoId));
}

/**
 * Marks these photos of the user removed, when they are theirs, in the workspace and not saved
 * to a sample; returns the ids it marked.
 */
export async function markPhotosRemoved(
  db: Executor,
  input: { organizationId: string; userId: string; photoIds: string[] },
): Promise<string[]> {
  if (input.photoIds.length === 0) return [];
  const rows = await db
    .update(photos)
    .set({ removedAt: sql`coalesce(${photos.removedAt}, now())` })
    .where(
      and(
        eq(photos.organizationId, input.organizationId),
        eq(photos.uploadedByUserId, input.userId),
        inArray(photos.id, input.photoIds),
        noLiveDrop,
      ),
    )
    .returning({ id: photos.id });
  return rows.map((r) => r.id);
}

/** Photos of the organization by id, in the order asked for (unknown ids are skipped). */
export async function listPhotosByIds(
  organizationId: string,
  ids: string[],
): Promise<PhotoSummary[]> {
  if (ids.length === 0) return [];
  const rows = await getDb()
    .select(photoSummaryColumns)
    .from(photos)
    .where(and(eq(photos.organizationId, organizationId), inArray(photos.id, ids)));
  return ids.flatMap((id) => rows.filter((r) => r.id === id));
}
