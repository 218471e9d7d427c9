import 'server-only';
import { and, eq, isNull } from 'drizzle-orm';
import { pendingSignUps } from '../schema';
import { newId } from './ids';
import type { Executor, Transaction } from './transaction';

export type PendingSignUp = typeof pendingSignUps.$inferSelect;

export async function insertPendingSignUp(
  tx: Executor,
  input: Omit<typeof pendingSignUps.$inferInsert, 'id' | 'usedAt' | 'createdAt'>,
): Promise<void> {
  await tx.insert(pendingSignUps).values({ id: newId(), ...input });
}

/** The pending sign-up of a link, locked for the rest of the transaction, or null. */
export async function lockPendingSignUp(
  tx: Transaction,
  tokenHash: string,
): Promise<PendingSignUp | null> {
  const [row] = await tx
    .select()
    .from(pendingSignUps)
    .where(eq(pendingSignUps.tokenHash, tokenHash))
    .for('update');
  return row ?? null;
}

/** Uses up every open link for `email` (one account per address). */
export async function closePendingSignUps(tx: Executor, email: string, at: Date): Promise<void> {
  await tx
    .update(pendingSignUps)
    .set({ usedAt: at })
    .where(and(eq(pendingSignUps.email, email), isNull(pendingSignUps.usedAt)));
}
