import 'server-only';
import { and, count, eq, gt } from 'drizzle-orm';
import { getDb } from '../client';
import { signInAttempts } from '../schema';

export async function recordSignInAttempt(input: {
  email: string;
  ipAddress: string;
  succeeded: boolean;
}): Promise<void> {
  await getDb().insert(signInAttempts).values(input);
}

/** Failed attempts since `since`, for one account and for one network address. */
export async function countRecentFailures(input: { email: string; ipAddress: string; since: Date }) {
  const db = getDb();
  const [byEmail] = await db
    .select({ n: count() })
    .from(signInAttempts)
    .where(
      and(
        eq(signInAttempts.email, input.email),
        eq(signInAttempts.succeeded, false),
        gt(signInAttempts.createdAt, input.since),
      ),
    );
  const [byAddress] = await db
    .select({ n: count() })
    .from(signInAttempts)
    .where(
      and(
        eq(signInAttempts.ipAddress, input.ipAddress),
        eq(signInAttempts.succeeded, false),
        gt(signInAttempts.createdAt, input.since),
      ),
    );
  return { byEmail: byEmail?.n ?? 0, byAddress: byAddress?.n ?? 0 };
}
