import 'server-only';
import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import { invitations, organizations, users } from '../schema';
import { database, type Executor } from './transaction';

/** An invitation to `email` that is neither accepted, revoked nor expired, if any. */
export async function findOpenInvitationTo(db: Executor, organizationId: string, email: string) {
  const [row] = await db
    .select({ expiresAt: invitations.expiresAt })
    .from(invitations)
    .where(
      and(
        eq(invitations.organizationId, organizationId),
        eq(invitations.email, email),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
        gt(invitations.expiresAt, new Date()),
      ),
    );
  return row ?? null;
}

export async function insertInvitation(
  db: Executor,
  row: typeof invitations.$inferInsert,
): Promise<void> {
  await db.insert(invitations).values(row);
}

/** Invitations not yet accepted or revoked (open and expired), newest first. */
export async function listUnansweredInvitations(organizationId: string) {
  return database()
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
      createdAt: invitations.createdAt,
      invitedBy: users.name,
    })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedByUserId))
    .where(
      and(
        eq(invitations.organizationId, organizationId),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
      ),
    )
    .orderBy(desc(invitations.createdAt));
}

/** An invitation of the organization, locked until the transaction ends. */
export async function lockInvitation(db: Executor, organizationId: string, invitationId: string) {
  const [row] = await db
    .select()
    .from(invitations)
    .where(and(eq(invitations.id, invitationId), eq(invitations.organizationId, organizationId)))
    .for('update');
  return row ?? null;
}

/** The invitation with this token hash, locked until the transaction ends. */
export async function lockInvitationByTokenHash(db: Executor, tokenHash: string) {
  const [row] = await db
    .select()
    .from(invitations)
    .where(eq(invitations.tokenHash, tokenHash))
    .for('update');
  return row ?? null;
}

export async function markInvitation(
  db: Executor,
  invitationId: string,
  change: { acceptedAt: Date } | { revokedAt: Date },
): Promise<void> {
  await db.update(invitations).set(change).where(eq(invitations.id, invitationId));
}

/** An invitation with its organization's name, by token hash; null when none has it. */
export async function findInvitationByTokenHash(tokenHash: string) {
  const [row] = await database()
    .select({
      id: invitations.id,
      organizationId: invitations.organizationId,
      organizationName: organizations.name,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
    })
    .from(invitations)
    .innerJoin(organizations, eq(organizations.id, invitations.organizationId))
    .where(eq(invitations.tokenHash, tokenHash));
  return row ?? null;
}
