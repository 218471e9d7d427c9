import 'server-only';
import { eq } from 'drizzle-orm';
import { getDb } from '../client';
import { memberships, organizations, users, type Role } from '../schema';
import { recordAudit } from './audit';
import { newId, slugify } from './ids';

export async function findUserByEmail(email: string) {
  const rows = await getDb().select().from(users).where(eq(users.email, email)).limit(1);
  return rows[0] ?? null;
}

export class EmailTakenError extends Error {
  constructor() {
    super('An account with this e-mail address already exists. Sign in instead.');
  }
}

/**
 * Sign-up: the user, a new organization and the user's admin membership, in one transaction.
 */
export async function createUserWithOrganization(
  input: {
    email: string;
    name: string;
    passwordHash: string;
    organizationName: string;
    /** When the address was proven (a finished sign-up link). */
    emailVerifiedAt?: Date;
  },
  /** Run on this transaction instead of a new one. */
  onTransaction?: Parameters<Parameters<ReturnType<typeof getDb>['transaction']>[0]>[0],
): Promise<{ userId: string; organizationId: string }> {
  const run = <T,>(body: (tx: NonNullable<typeof onTransaction>) => Promise<T>) =>
    onTransaction ? body(onTransaction) : getDb().transaction(body);
  return run(async (tx) => {
    const existing = await tx.select({ id: users.id }).from(users).where(eq(users.email, input.email));
    if (existing.length > 0) throw new EmailTakenError();
    const userId = newId();
    const organizationId = newId();
    await tx.insert(users).values({
      id: userId,
      email: input.email,
      name: input.name,
      passwordHash: input.passwordHash,
      emailVerifiedAt: input.emailVerifiedAt ?? null,
    });
    await tx.insert(organizations).values({
      id: organizationId,
      name: input.organizationName,
      slug: `${slugify(input.organizationName)}-${organizationId.slice(0, 6).toLowerCase()}`,
    });
    await tx.insert(memberships).values({ userId, organizationId, role: 'admin' satisfies Role });
    await recordAudit(tx, {
      actorUserId: userId,
      organizationId,
      action: 'organization.create',
      entityType: 'organization',
      entityId: organizationId,
      after: { name: input.organizationName, createdBy: input.email },
    });
    return { userId, organizationId };
  });
}
