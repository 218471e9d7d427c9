import { eq } from 'drizzle-orm';
import { hashPassword } from '@/lib/auth/password';
import { closeDb, getDb } from './client';
import { DEMO_ORGANIZATION, DEMO_PASSWORD, DEMO_USERS } from './demo';
import { ensureProbeLiquidLibrary } from './probe-liquid-library';
import { recordAudit } from './queries/audit';
import { seedDemoRecords } from './seed-demo-records';
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
  if (existing.length > 0) {
    await seedRecordsOf(existing[0].id);
    return 'present';
  }
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const organizationIdOf = newId();
  await db.transaction(async (tx) => {
    const organizationId = organizationIdOf;
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
  await seedRecordsOf(organizationIdOf);
  return 'created';
}

/** The demo's lab records and drops; coatings already present are left as they are. */
async function seedRecordsOf(organizationId: string): Promise<void> {
  const db = getDb();
  const members = await db
    .select({ id: users.id, email: users.email, name: users.name })
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .where(eq(memberships.organizationId, organizationId));
  const analyst = members.find((m) => m.email === DEMO_USERS[1].email);
  const admin = members.find((m) => m.email === DEMO_USERS[0].email);
  if (!analyst || !admin) return;
  await seedDemoRecords(
    db,
    { organizationId, analystUserId: analyst.id, analystName: analyst.name, adminUserId: admin.id },
    (line) => console.log(line),
  );
}

const isMain = process.argv[1] && /seed\.ts$/.test(process.argv[1]);
if (isMain) {
  seedDemo()
    .then((outcome) =>
      console.log(`[db] demo ${outcome === 'created' ? 'seeded' : 'already present'}`),
    )
    .catch((error: unknown) => {
      console.error('[db] seeding failed:', error);
      process.exitCode = 1;
    })
    .finally(() => closeDb());
}
