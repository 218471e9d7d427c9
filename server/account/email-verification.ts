import 'server-only';
import {
  countTokensSince,
  insertEmailVerificationToken,
  lockVerificationToken,
  markVerificationTokenUsed,
} from '@/db/queries/account-tokens';
import { newId } from '@/db/queries/ids';
import { inTransaction } from '@/db/queries/transaction';
import { findUserById, updateUser } from '@/db/queries/users';
import { AppError, unauthorized } from '@/lib/app-error';
import { EMAIL_VERIFICATION_LIFETIME_MS, hashToken, newToken } from '@/lib/auth/tokens';
import { appUrl } from '@/lib/config';
import { emailVerificationMail } from '@/lib/email/messages';
import { enqueueMail } from '../mail/queue';
import { tokenStatus, verificationTokenError } from './token-errors';

const RESEND_AFTER_MS = 60_000;

/** Queues a confirmation mail for the user's address; refuses a resend within a minute. */
export async function sendEmailVerification(userId: string): Promise<'sent' | 'already-verified'> {
  return inTransaction(async (tx) => {
    const user = await findUserById(tx, userId);
    if (!user) throw unauthorized();
    if (user.emailVerifiedAt) return 'already-verified';
    const since = new Date(Date.now() - RESEND_AFTER_MS);
    if ((await countTokensSince(tx, 'verification', userId, since)) > 0) {
      throw new AppError(
        'too_soon',
        'We sent a confirmation mail less than a minute ago. Check your inbox and spam folder, or try again in a minute.',
      );
    }
    const { token, tokenHash } = newToken();
    await insertEmailVerificationToken(tx, {
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
  return inTransaction(async (tx) => {
    const row = await lockVerificationToken(tx, hashToken(token));
    const status = tokenStatus(row);
    if (!row || status !== 'valid')
      throw verificationTokenError(status === 'valid' ? 'unknown' : status);
    const user = await findUserById(tx, row.userId);
    if (!user || user.email !== row.email) throw verificationTokenError('stale');
    const now = new Date();
    await markVerificationTokenUsed(tx, row.id, now);
    await updateUser(tx, row.userId, { emailVerifiedAt: now });
    return { userId: row.userId, email: row.email };
  });
}
