import 'server-only';
import { and, asc, eq } from 'drizzle-orm';
import { getDb } from '../client';
import { memberships, organizations, sessions, users, type Role } from '../schema';
import { recordAudit } from './audit';

export type MembershipSummary = {
  organizationId: string;
  organizationName: string;
  role: Role;
};

export async function listMembershipsOfUser(userId: string): Promise<MembershipSummary[]> {
  return getDb()
    .select({
      organizationId: memberships.organizationId,
      organizationName: organizations.name,
      role: memberships.role,
    })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(organizations.name));
}

export async function listMembers(organizationId: string) {
  return getDb()
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      role: memberships.role,
      joinedAt: memberships.createdAt,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.organizationId, organizationId))
    .orderBy(asc(users.name));
}

export async function renameOrganization(input: {
  organizationId: string;
  name: string;
  actorUserId: string;
}): Promise<void> {
  await getDb().transaction(async (tx) => {
    const [before] = await tx
      .select({ name: organizations.name })
      .from(organizations)
      .where(eq(organizations.id, input.organizationId));
    await tx
      .update(organizations)
      .set({ name: input.name })
      .where(eq(organizations.id, input.organizationId));
    await recordAudit(tx, {
      actorUserId: input.actorUserId,
      organizationId: input.organizationId,
      action: 'organization.update',
      entityType: 'organization',
      entityId: input.organizationId,
      before,
      after: { name: input.name },
    });
  });
}

export async function findMembership(userId: string, organizationId: string) {
  const rows = await getDb()
    .select({ role: memberships.role, organizationName: organizations.name })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(and(eq(memberships.userId, userId), eq(memberships.organizationId, organizationId)))
    .limit(1);
  return rows[0] ?? null;
}

/** Makes `organizationId` the session's active organization (after joining it, say). */
export async function setActiveOrganization(sessionId: string, organizationId: string): Promise<void> {
  await getDb().update(sessions).set({ activeOrganizationId: organizationId }).where(eq(sessions.id, sessionId));
}
