import 'server-only';
import { eq } from 'drizzle-orm';
import { generateIdFromEntropySize } from 'lucia';
import { SESSION_LIFETIME } from '@/lib/auth/lucia';
import { getDb } from '../client';
import { sessions } from '../schema';
import { recordAudit } from './audit';

/**
 * Lucia's createSession (same id size, same lifetime), written together with the sign-in's
 * audit row in one transaction. Returns the session id for lucia.createSessionCookie.
 */
export async function createSessionWithAudit(input: {
  userId: string;
  organizationId: string | null;
  ipAddress: string;
}): Promise<string> {
  const id = generateIdFromEntropySize(25);
  await getDb().transaction(async (tx) => {
    await tx.insert(sessions).values({
      id,
      userId: input.userId,
      expiresAt: new Date(Date.now() + SESSION_LIFETIME.milliseconds()),
      activeOrganizationId: input.organizationId,
    });
    await recordAudit(tx, {
      actorUserId: input.userId,
      organizationId: input.organizationId,
      action: 'auth.sign_in',
      entityType: 'user',
      entityId: input.userId,
      after: { ipAddress: input.ipAddress },
    });
  });
  return id;
}

/** Lucia's invalidateSession with the sign-out's audit row, in one transaction. */
export async function deleteSessionWithAudit(input: {
  sessionId: string;
  userId: string;
  organizationId: string | null;
}): Promise<void> {
  await getDb().transaction(async (tx) => {
    const deleted = await tx
      .delete(sessions)
      .where(eq(sessions.id, input.sessionId))
      .returning({ id: sessions.id });
    if (deleted.length === 0) return;
    await recordAudit(tx, {
      actorUserId: input.userId,
      organizationId: input.organizationId,
      action: 'auth.sign_out',
      entityType: 'user',
      entityId: input.userId,
    });
  });
}
