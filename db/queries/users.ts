import 'server-only';
import { eq } from 'drizzle-orm';
import { users } from '../schema';
import { database, type Executor } from './transaction';

export async function findUserByEmail(email: string, db: Executor = database()) {
  const rows = await db.select().from(users).where(eq(users.email, email)).limit(1);
  return rows[0] ?? null;
}

export async function findUserById(db: Executor, userId: string) {
  const [row] = await db
    .select({
      id: users.id,
      name: users.name,
      email: users.email,
      emailVerifiedAt: users.emailVerifiedAt,
    })
    .from(users)
    .where(eq(users.id, userId));
  return row ?? null;
}

export async function insertUser(db: Executor, row: typeof users.$inferInsert): Promise<void> {
  await db.insert(users).values(row);
}

export async function updateUser(
  db: Executor,
  userId: string,
  change: { passwordHash: string } | { emailVerifiedAt: Date },
): Promise<void> {
  await db.update(users).set(change).where(eq(users.id, userId));
}
