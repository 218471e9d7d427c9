import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { memberships, organizations, sessions, users } from '@/db/schema';
import { newId } from '@/db/queries/ids';
import { getLucia } from '@/lib/auth/lucia';
import { ROLES, type Role } from '@/lib/auth/permissions';

export const TEST_PASSWORD = 'correct horse battery staple';
let cachedHash: string | null = null;

async function passwordHash(): Promise<string> {
  const { hashPassword } = await import('@/lib/auth/password');
  cachedHash ??= await hashPassword(TEST_PASSWORD);
  return cachedHash;
}

export function uniqueEmail(label: string): string {
  return `${label}-${randomBytes(5).toString('hex')}@test.example`;
}

export async function createOrganization(name = `Test lab ${randomBytes(3).toString('hex')}`) {
  const id = newId();
  await getDb().insert(organizations).values({ id, name, slug: `test-${id.toLowerCase()}` });
  return { id, name };
}

/** A user who is a member of `organizationId` with `role`, and a live session in it. */
export async function createMember(organizationId: string, role: Role) {
  const userId = newId();
  const email = uniqueEmail(role);
  await getDb()
    .insert(users)
    .values({ id: userId, email, name: `Test ${role}`, passwordHash: await passwordHash() });
  await getDb().insert(memberships).values({ userId, organizationId, role });
  const session = await getLucia().createSession(userId, { activeOrganizationId: organizationId });
  return { userId, email, sessionId: session.id };
}

export type Member = Awaited<ReturnType<typeof createMember>>;

/** A lab with one member of each role, and an outsider: the admin of another lab. */
export async function labWithEveryRole() {
  const lab = await createOrganization();
  const otherLab = await createOrganization();
  const members = {} as Record<Role, Member>;
  for (const role of ROLES) members[role] = await createMember(lab.id, role);
  const outsider = await createMember(otherLab.id, 'admin');
  return { lab, otherLab, members, outsider };
}

export async function organizationName(id: string): Promise<string | undefined> {
  const rows = await getDb().select().from(organizations).where(eq(organizations.id, id));
  return rows[0]?.name;
}

export async function expireSession(sessionId: string): Promise<void> {
  await getDb()
    .update(sessions)
    .set({ expiresAt: new Date(Date.now() - 60_000) })
    .where(eq(sessions.id, sessionId));
}
