import 'server-only';
import { and, count, eq, gt, isNull } from 'drizzle-orm';
import {
  emailVerificationTokens,
  memberships,
  passwordResetTokens,
  sessions,
  users,
} from '../schema';
import { database, type Executor } from './transaction';

/*
 * The single-use tokens of password-reset and address-confirmation links. Only their SHA-256 is
 * stored; lib/auth/tokens.ts makes them, server/account uses them.
 */

const TABLES = { reset: passwordResetTokens, verification: emailVerificationTokens } as const;
export type TokenKind = keyof typeof TABLES;

/** How many tokens of this kind the user got since `since` (to space out mails). */
export async function countTokensSince(
  db: Executor,
  kind: TokenKind,
  userId: string,
  since: Date,
): Promise<number> {
  const table = TABLES[kind];
  const [row] = await db
    .select({ n: count() })
    .from(table)
    .where(and(eq(table.userId, userId), gt(table.createdAt, since)));
  return row?.n ?? 0;
}

export async function insertPasswordResetToken(
  db: Executor,
  row: typeof passwordResetTokens.$inferInsert,
): Promise<void> {
  await db.insert(passwordResetTokens).values(row);
}

export async function insertEmailVerificationToken(
  db: Executor,
  row: typeof emailVerificationTokens.$inferInsert,
): Promise<void> {
  await db.insert(emailVerificationTokens).values(row);
}

/** When a reset token expires and whether it was used; null when no token has this hash. */
export async function findPasswordResetToken(tokenHash: string) {
  const [row] = await database()
    .select({ usedAt: passwordResetTokens.usedAt, expiresAt: passwordResetTokens.expiresAt })
    .from(passwordResetTokens)
    .where(eq(passwordResetTokens.tokenHash, tokenHash));
  return row ?? null;
}

/** A reset token by hash, locked until the transaction ends. */
export async function lockResetToken(db: Executor, tokenHash: string) {
  const [row] = await db
    .select()
    .from(passwordResetTokens)
    .where(eq(passwordResetTokens.tokenHash, tokenHash))
    .for('update');
  return row ?? null;
}

/** An address-confirmation token by hash, locked until the transaction ends. */
export async function lockVerificationToken(db: Executor, tokenHash: string) {
  const [row] = await db
    .select()
    .from(emailVerificationTokens)
    .where(eq(emailVerificationTokens.tokenHash, tokenHash))
    .for('update');
  return row ?? null;
}

/** Uses up every open reset link of the user. */
export async function useOpenResetTokens(db: Executor, userId: string, at: Date): Promise<void> {
  await db
    .update(passwordResetTokens)
    .set({ usedAt: at })
    .where(and(eq(passwordResetTokens.userId, userId), isNull(passwordResetTokens.usedAt)));
}

export async function markVerificationTokenUsed(db: Executor, id: string, at: Date): Promise<void> {
  await db
    .update(emailVerificationTokens)
    .set({ usedAt: at })
    .where(eq(emailVerificationTokens.id, id));
}

/** Ends every session of a user (lucia.invalidateUserSessions, on the caller's transaction). */
export async function deleteSessionsOfUser(db: Executor, userId: string): Promise<number> {
  const ended = await db
    .delete(sessions)
    .where(eq(sessions.userId, userId))
    .returning({ id: sessions.id });
  return ended.length;
}

/** The organizations a user belongs to (ids only). */
export async function organizationIdsOfUser(db: Executor, userId: string): Promise<string[]> {
  const rows = await db
    .select({ organizationId: memberships.organizationId })
    .from(memberships)
    .where(eq(memberships.userId, userId));
  return rows.map((r) => r.organizationId);
}

export async function emailVerifiedAt(userId: string): Promise<Date | null> {
  const [row] = await database()
    .select({ verifiedAt: users.emailVerifiedAt })
    .from(users)
    .where(eq(users.id, userId));
  return row?.verifiedAt ?? null;
}
