import 'server-only';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Member, MembershipSummary } from '@/lib/contracts/team';
import { memberships, organizations, sessions, users, type Role } from '../schema';
import { slugify } from './ids';
import { database, type Executor } from './transaction';

export type { MembershipSummary };

/**
 * A session with its user and the user's memberships (as listMembershipsOfUser orders them), in
 * one round trip: what every signed-in request needs first (lib/auth/lucia.ts). Null when there
 * is no such session.
 */
export async function findSessionWithMemberships(sessionId: string) {
  const [row] = await database()
    .select({
      session: sessions,
      user: users,
      memberships: sql<MembershipSummary[]>`coalesce((
        select json_agg(json_build_object(
                 'organizationId', m.organization_id,
                 'organizationName', o.name,
                 'role', m.role) order by o.name)
        from ${memberships} m join ${organizations} o on o.id = m.organization_id
        where m.user_id = ${users.id}), '[]'::json)`,
    })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(eq(sessions.id, sessionId));
  return row ?? null;
}

export async function listMembershipsOfUser(userId: string): Promise<MembershipSummary[]> {
  return database()
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

export async function listMembers(organizationId: string): Promise<Member[]> {
  return database()
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

/** The members of the organization who hold one of `roles`, with their name and e-mail. */
export async function listMembersWithRoles(db: Executor, organizationId: string, roles: Role[]) {
  if (roles.length === 0) return [];
  return db
    .select({ userId: users.id, name: users.name, email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.organizationId, organizationId), inArray(memberships.role, roles)))
    .orderBy(asc(users.name));
}

export async function findOrganization(db: Executor, organizationId: string) {
  const [row] = await db
    .select({ id: organizations.id, name: organizations.name })
    .from(organizations)
    .where(eq(organizations.id, organizationId));
  return row ?? null;
}

export async function insertOrganization(
  db: Executor,
  row: { id: string; name: string },
): Promise<void> {
  await db.insert(organizations).values({
    ...row,
    slug: `${slugify(row.name)}-${row.id.slice(0, 6).toLowerCase()}`,
  });
}

export async function updateOrganizationName(
  db: Executor,
  organizationId: string,
  name: string,
): Promise<void> {
  await db.update(organizations).set({ name }).where(eq(organizations.id, organizationId));
}

/** A user's role in an organization and its name; null when not a member. */
export async function findMembership(
  userId: string,
  organizationId: string,
  db: Executor = database(),
) {
  const rows = await db
    .select({ role: memberships.role, organizationName: organizations.name })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(and(eq(memberships.userId, userId), eq(memberships.organizationId, organizationId)))
    .limit(1);
  return rows[0] ?? null;
}

/** The member of an organization with this e-mail, if any. */
export async function findMemberByEmail(db: Executor, organizationId: string, email: string) {
  const [row] = await db
    .select({ userId: users.id })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.organizationId, organizationId), eq(users.email, email)));
  return row ?? null;
}

/** The organization's members, locked so two admins cannot demote each other at once. */
export async function lockMembers(db: Executor, organizationId: string) {
  return db
    .select({
      userId: memberships.userId,
      role: memberships.role,
      name: users.name,
      email: users.email,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.organizationId, organizationId))
    .for('update', { of: memberships });
}

export async function insertMembership(
  db: Executor,
  row: { userId: string; organizationId: string; role: Role },
): Promise<void> {
  await db.insert(memberships).values(row);
}

const membershipOf = (userId: string, organizationId: string) =>
  and(eq(memberships.userId, userId), eq(memberships.organizationId, organizationId));

export async function updateMemberRole(
  db: Executor,
  member: { userId: string; organizationId: string },
  role: Role,
): Promise<void> {
  await db
    .update(memberships)
    .set({ role })
    .where(membershipOf(member.userId, member.organizationId));
}

export async function deleteMembership(
  db: Executor,
  member: { userId: string; organizationId: string },
): Promise<void> {
  await db.delete(memberships).where(membershipOf(member.userId, member.organizationId));
}

/** Makes `organizationId` the session's active organization (after joining it, say). */
export async function setActiveOrganization(
  sessionId: string,
  organizationId: string,
): Promise<void> {
  await database()
    .update(sessions)
    .set({ activeOrganizationId: organizationId })
    .where(eq(sessions.id, sessionId));
}
