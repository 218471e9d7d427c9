import 'server-only';
import { and, count, eq, gt, isNull } from 'drizzle-orm';
import { HttpError } from '@/lib/api/errors';
import { appUrl } from '@/lib/config';
import { enqueueMail } from '@/lib/email/queue';
import { emailVerificationMail, passwordResetMail } from '@/lib/email/messages';
import {
  EMAIL_VERIFICATION_LIFETIME_MS,
  hashToken,
  newToken,
  PASSWORD_RESET_LIFETIME_MS,
} from '@/lib/auth/tokens';
import { getDb } from '../client';
import {
  emailVerificationTokens,
  memberships,
  passwordResetTokens,
  sessions,
  users,
} from '../schema';
import { recordAudit } from './audit';
import { newId } from './ids';

export type TokenStatus = 'valid' | 'used' | 'expired' | 'unknown';

function statusOf(row: { usedAt: Date | null; expiresAt: Date } | undefined): TokenStatus {
  if (!row) return 'unknown';
  if (row.usedAt) return 'used';
  if (row.expiresAt.getTime() <= Date.now()) return 'expired';
  return 'valid';
}

// ---------------------------------------------------------------------------------------------
// Password reset
// ---------------------------------------------------------------------------------------------

/** Reset mails per account in this window, beyond which requests are quietly dropped. */
const RESET_REQUESTS = { windowMs: 15 * 60_000, max: 3 };

/**
 * "Forgot password?": queues a reset mail when `email` has an account. Says nothing either way,
 * so the answer cannot tell whether an address has an account.
 */
export async function requestPasswordReset(email: string): Promise<void> {
  const [user] = await getDb()
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(eq(users.email, email));
  if (!user) return;
  await getDb().transaction(async (tx) => {
    const [recent] = await tx
      .select({ n: count() })
      .from(passwordResetTokens)
      .where(
        and(
          eq(passwordResetTokens.userId, user.id),
          gt(passwordResetTokens.createdAt, new Date(Date.now() - RESET_REQUESTS.windowMs)),
        ),
      );
    if ((recent?.n ?? 0) >= RESET_REQUESTS.max) return;
    const { token, tokenHash } = newToken();
    await tx.insert(passwordResetTokens).values({
      id: newId(),
      userId: user.id,
      tokenHash,
      expiresAt: new Date(Date.now() + PASSWORD_RESET_LIFETIME_MS),
    });
    await enqueueMail(tx, {
      kind: 'password-reset',
      ...passwordResetMail({
        to: user.email,
        name: user.name,
        link: `${appUrl()}/reset-password?token=${token}`,
      }),
    });
  });
}

export async function passwordResetTokenStatus(token: string): Promise<TokenStatus> {
  if (!token) return 'unknown';
  const [row] = await getDb()
    .select({ usedAt: passwordResetTokens.usedAt, expiresAt: passwordResetTokens.expiresAt })
    .from(passwordResetTokens)
    .where(eq(passwordResetTokens.tokenHash, hashToken(token)));
  return statusOf(row);
}

export function resetTokenError(status: Exclude<TokenStatus, 'valid'>): HttpError {
  const again = 'Ask for a new link with “Forgot password?” on the sign-in page.';
  if (status === 'used')
    return new HttpError(
      410,
      'token_used',
      `This link was already used to set a password. ${again}`,
    );
  if (status === 'expired')
    return new HttpError(
      410,
      'token_expired',
      `This link has expired (links last one hour). ${again}`,
    );
  return new HttpError(
    404,
    'token_not_found',
    `This link is not valid; check that you opened the whole link from the mail. ${again}`,
  );
}

/**
 * Sets the new password, uses up every open reset link of the account and ends all its sessions
 * (what lucia.invalidateUserSessions does, here inside the same transaction), with audit rows.
 */
export async function resetPassword(input: {
  token: string;
  passwordHash: string;
}): Promise<{ userId: string }> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .select()
      .from(passwordResetTokens)
      .where(eq(passwordResetTokens.tokenHash, hashToken(input.token)))
      .for('update');
    const status = statusOf(row);
    if (!row || status !== 'valid') throw resetTokenError(status === 'valid' ? 'unknown' : status);
    const now = new Date();
    await tx
      .update(users)
      .set({ passwordHash: input.passwordHash })
      .where(eq(users.id, row.userId));
    await tx
      .update(passwordResetTokens)
      .set({ usedAt: now })
      .where(and(eq(passwordResetTokens.userId, row.userId), isNull(passwordResetTokens.usedAt)));
    const ended = await tx
      .delete(sessions)
      .where(eq(sessions.userId, row.userId))
      .returning({ id: sessions.id });
    const orgs = await tx
      .select({ organizationId: memberships.organizationId })
      .from(memberships)
      .where(eq(memberships.userId, row.userId));
    // One row in each of the user's organizations, so every lab's admins see it.
    for (const organizationId of orgs.length ? orgs.map((o) => o.organizationId) : [null]) {
      await recordAudit(tx, {
        actorUserId: row.userId,
        organizationId,
        action: 'auth.password_reset',
        entityType: 'user',
        entityId: row.userId,
        after: { sessionsEnded: ended.length },
      });
    }
    return { userId: row.userId };
  });
}

// ---------------------------------------------------------------------------------------------
// E-mail verification
// ---------------------------------------------------------------------------------------------

const RESEND_AFTER_MS = 60_000;

/** Queues a confirmation mail for the user's address; refuses a resend within a minute. */
export async function sendEmailVerification(userId: string): Promise<'sent' | 'already-verified'> {
  return getDb().transaction(async (tx) => {
    const [user] = await tx
      .select({
        id: users.id,
        name: users.name,
        email: users.email,
        verifiedAt: users.emailVerifiedAt,
      })
      .from(users)
      .where(eq(users.id, userId));
    if (!user)
      throw new HttpError(401, 'unauthorized', 'You are not signed in. Sign in and try again.');
    if (user.verifiedAt) return 'already-verified';
    const [recent] = await tx
      .select({ n: count() })
      .from(emailVerificationTokens)
      .where(
        and(
          eq(emailVerificationTokens.userId, userId),
          gt(emailVerificationTokens.createdAt, new Date(Date.now() - RESEND_AFTER_MS)),
        ),
      );
    if ((recent?.n ?? 0) > 0) {
      throw new HttpError(
        429,
        'too_soon',
        'We sent a confirmation mail less than a minute ago. Check your inbox and spam folder, or try again in a minute.',
      );
    }
    const { token, tokenHash } = newToken();
    await tx.insert(emailVerificationTokens).values({
      id: newId(),
      userId,
      email: user.email,
      tokenHash,
      expiresAt: new Date(Date.now() + EMAIL_VERIFICATION_LIFETIME_MS),
    });
    await enqueueMail(tx, {
      kind: 'email-verification',
      ...emailVerificationMail({
        to: user.email,
        name: user.name,
        link: `${appUrl()}/verify-email?token=${token}`,
      }),
    });
    return 'sent';
  });
}

/** Marks the address confirmed; the link is single-use and must match the account's address. */
export async function verifyEmail(token: string): Promise<{ userId: string; email: string }> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .select()
      .from(emailVerificationTokens)
      .where(eq(emailVerificationTokens.tokenHash, hashToken(token)))
      .for('update');
    const status = statusOf(row);
    const again = 'Sign in and use “Send the mail again” on the dashboard for a new link.';
    if (!row || status === 'unknown') {
      throw new HttpError(
        404,
        'token_not_found',
        `This link is not valid; check that you opened the whole link from the mail. ${again}`,
      );
    }
    if (status === 'used')
      throw new HttpError(
        410,
        'token_used',
        'This link was already used; your address is confirmed.',
      );
    if (status === 'expired')
      throw new HttpError(
        410,
        'token_expired',
        `This link has expired (links last 7 days). ${again}`,
      );
    const [user] = await tx
      .select({ email: users.email })
      .from(users)
      .where(eq(users.id, row.userId));
    if (!user || user.email !== row.email) {
      throw new HttpError(
        410,
        'token_stale',
        `This link was sent to an address the account no longer uses. ${again}`,
      );
    }
    const now = new Date();
    await tx
      .update(emailVerificationTokens)
      .set({ usedAt: now })
      .where(eq(emailVerificationTokens.id, row.id));
    await tx.update(users).set({ emailVerifiedAt: now }).where(eq(users.id, row.userId));
    return { userId: row.userId, email: row.email };
  });
}

export async function emailVerifiedAt(userId: string): Promise<Date | null> {
  const [row] = await getDb()
    .select({ verifiedAt: users.emailVerifiedAt })
    .from(users)
    .where(eq(users.id, userId));
  return row?.verifiedAt ?? null;
}
