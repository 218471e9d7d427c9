import 'server-only';
import { and, desc, eq, inArray } from 'drizzle-orm';
import type { TensiometryKind } from '@/lib/validation/tensiometry';
import { getDb } from '../client';
import { tensiometryResults, users } from '../schema';
import { recordAudit } from './audit';
import { newId } from './ids';
import type { Actor } from './records';

export type TensiometryResult = {
  id: string;
  kind: TensiometryKind;
  inputs: Record<string, unknown>;
  outputs: Record<string, unknown>;
  /** The photo a pendant-drop result was fitted from, when it came from an uploaded photo. */
  photoId: string | null;
  createdByUserId: string | null;
  createdByName: string | null;
  createdAt: Date;
};

/**
 * Stores a tensiometry calculation with the inputs it was computed from and, for a pendant drop
 * fitted from an uploaded photo, that photo (the caller has checked it belongs to the
 * organization).
 */
export async function saveTensiometryResult(
  actor: Actor,
  kind: TensiometryKind,
  inputs: Record<string, unknown>,
  outputs: Record<string, unknown>,
  options: { photoId?: string | null } = {},
): Promise<TensiometryResult> {
  const photoId = options.photoId ?? null;
  const id = newId();
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .insert(tensiometryResults)
      .values({
        id,
        organizationId: actor.organizationId,
        kind,
        inputs,
        outputs,
        photoId,
        createdByUserId: actor.userId,
      })
      .returning();
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'tensiometry_result.create',
      entityType: 'tensiometry_result',
      entityId: id,
      after: photoId ? { kind, photoId } : { kind },
    });
    return { ...row, createdByName: null };
  });
}

/** Saved tensiometry results of the organization, newest first; optionally of some kinds. */
export async function listTensiometryResults(
  organizationId: string,
  options: { kinds?: readonly TensiometryKind[]; limit?: number } = {},
): Promise<TensiometryResult[]> {
  const rows = await getDb()
    .select({ result: tensiometryResults, createdByName: users.name })
    .from(tensiometryResults)
    .leftJoin(users, eq(users.id, tensiometryResults.createdByUserId))
    .where(
      and(
        eq(tensiometryResults.organizationId, organizationId),
        options.kinds?.length ? inArray(tensiometryResults.kind, [...options.kinds]) : undefined,
      ),
    )
    .orderBy(desc(tensiometryResults.createdAt), desc(tensiometryResults.id))
    .limit(options.limit ?? 50);
  return rows.map(({ result, createdByName }) => ({ ...result, createdByName }));
}
