import { eq } from 'drizzle-orm';
import { hashPassword } from '@/lib/auth/password';
import { closeDb, getDb } from './client';
import { DEMO_ORGANIZATION, DEMO_PASSWORD, DEMO_USERS } from './demo';
import { ensureProbeLiquidLibrary } from './probe-liquid-library';
import { recordAudit } from './queries/audit';
import { newId } from './queries/ids';
import { memberships, organizations, users } from './schema';

/** Seeds the demo organization once; a second run finds it and leaves everything as it is. */
export async function seedDemo(): Promise<'created' | 'present'> {
  const db = getDb();
  await ensureProbeLiquidLibrary(db);
  const existing = await db
    .select({ id: organizations.id })
    .from(organizations)
    .where(eq(organizations.slug, DEMO_ORGANIZATION.slug));
  if (existing.length > 0) return 'present';
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    const organizationId = newId();
    await tx.insert(organizations).values({ id: organizationId, ...DEMO_ORGANIZATION });
    for (const demoUser of DEMO_USERS) {
      const userId = newId();
      await tx.insert(users).values({
        id: userId,
        email: demoUser.email,
        name: demoUser.name,
        passwordHash,
        emailVerifiedAt: new Date(),
      });
      await tx.insert(memberships).values({ userId, organizationId, role: demoUser.role });
    }
    await recordAudit(tx, {
      actorUserId: null,
      organizationId,
      action: 'demo.seed',
      entityType: 'organization',
      entityId: organizationId,
      after: { name: DEMO_ORGANIZATION.name, users: DEMO_USERS.map((u) => u.email) },
    });
  });
  return 'created';
}

const isMain = process.argv[1] && /seed\.ts$/.test(process.argv[1]);
if (isMain) {
  seedDemo()
    .then((outcome) => console.log(`[db] demo ${outcome === 'created' ? 'seeded' : 'already present'}`))
    .catch((error: unknown) => {
      console.error('[db] seeding failed:', error);
      process.exitCode = 1;
    })
    .finally(() => closeDb());
}
