import 'server-only';
import {
  countTokensSince,
  deleteSessionsOfUser,
  findPasswordResetToken,
  insertPasswordResetToken,
  lockResetToken,
  organizationIdsOfUser,
  useOpenResetTokens,
} from '@/db/queries/account-tokens';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { inTransaction } from '@/db/queries/transaction';
import { findUserByEmail, updateUser } from '@/db/queries/users';
import { runAfterResponse } from '@/lib/auth/after-response';
import { hashPassword } from '@/lib/auth/password';
import { hashToken, newToken, PASSWORD_RESET_LIFETIME_MS } from '@/lib/auth/tokens';
import { appUrl } from '@/lib/config';
import { passwordResetMail } from '@/lib/email/messages';
import { enqueueMail } from '../mail/queue';
import { resetTokenError, tokenStatus, type TokenStatus } from './token-errors';

/** Reset mails per account in this window, beyond which requests are quietly dropped. */
const RESET_REQUESTS = { windowMs: 15 * 60_000, max: 3 };

/**
 * "Forgot password?": queues a reset mail when `email` has an account, with its token, in one
 * transaction. Says nothing either way, and does the work after the answer is sent, so neither
 * the answer nor its timing can tell whether an address has an account.
 */
export async function requestPasswordReset(email: string): Promise<void> {
  await runAfterResponse('password-reset', () => mailPasswordReset(email));
}

async function mailPasswordReset(email: string): Promise<void> {
  const user = await findUserByEmail(email);
  if (!user) return;
  await inTransaction(async (tx) => {
    const since = new Date(Date.now() - RESET_REQUESTS.windowMs);
    if ((await countTokensSince(tx, 'reset', user.id, since)) >= RESET_REQUESTS.max) return;
    const { token, tokenHash } = newToken();
    await insertPasswordResetToken(tx, {
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

/** Whether a reset link still works (the page shows the form or says why not). */
export async function passwordResetTokenStatus(token: string): Promise<TokenStatus> {
  if (!token) return 'unknown';
  return tokenStatus(await findPasswordResetToken(hashToken(token)));
}

/**
 * Sets the new password, uses up every open reset link of the account and ends all its sessions,
 * with one audit row in each of the user's organizations (so every lab's admins see it), in one
 * transaction.
 */
export async function resetPassword(input: {
  token: string;
  password: string;
}): Promise<{ userId: string }> {
  const passwordHash = await hashPassword(input.password);
  return inTransaction(async (tx) => {
    const row = await lockResetToken(tx, hashToken(input.token));
    const status = tokenStatus(row);
    if (!row || status !== 'valid') throw resetTokenError(status === 'valid' ? 'unknown' : status);
    await updateUser(tx, row.userId, { passwordHash });
    await useOpenResetTokens(tx, row.userId, new Date());
    const sessionsEnded = await deleteSessionsOfUser(tx, row.userId);
    const organizations = await organizationIdsOfUser(tx, row.userId);
    for (const organizationId of organizations.length ? organizations : [null]) {
      await recordAudit(tx, {
        actorUserId: row.userId,
        organizationId,
        action: 'auth.password_reset',
        entityType: 'user',
        entityId: row.userId,
        after: { sessionsEnded },
      });
    }
    return { userId: row.userId };
  });
}

/** What the reset page says when a link does not work; null when it does. */
export async function resetLinkProblem(token: string): Promise<string | null> {
  const status = await passwordResetTokenStatus(token);
  return status === 'valid' ? null : resetTokenError(status).message;
}
