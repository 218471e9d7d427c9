import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { insertMembership, insertOrganization } from '@/db/queries/organizations';
import { violatedUniqueConstraint } from '@/db/queries/records';
import { closePendingSignUps, insertPendingSignUp, lockPendingSignUp } from '@/db/queries/sign-ups';
import { inTransaction } from '@/db/queries/transaction';
import { findUserByEmail, insertUser } from '@/db/queries/users';
import { AppError } from '@/lib/app-error';
import { runAfterResponse } from '@/lib/auth/after-response';
import { hashPassword } from '@/lib/auth/password';
import { startSession } from '@/lib/auth/session';
import { admitSignUp } from '@/lib/auth/sign-in';
import { hashToken, newToken, SIGN_UP_LIFETIME_MS } from '@/lib/auth/tokens';
import { appUrl } from '@/lib/config';
import { signUpExistingAccountMail, signUpLinkMail } from '@/lib/email/messages';
import { enqueueMail } from '../mail/queue';
import { tokenStatus } from './token-errors';

/*
 * Sign-up in two steps, so the form answers the same whether or not the address has an account:
 * requestSignUp mails a link to a new address (nothing is created yet) or, to an address that
 * already has an account, a note to its holder; finishSignUp, from the link, creates the user,
 * the organization and the admin membership, with the address confirmed.
 */

type SignUpRequest = { name: string; email: string; password: string; organizationName: string };

/**
 * The sign-up form: throttled per network address; the password is hashed for every address and
 * the mail is queued after the answer is sent, so neither the answer nor its timing tells whether
 * the address has an account.
 */
export async function requestSignUp(input: SignUpRequest, ipAddress: string): Promise<void> {
  const admitted = await admitSignUp({ email: input.email, ipAddress });
  if (!admitted.ok) throw new AppError('too_many_attempts', admitted.message);
  const passwordHash = await hashPassword(input.password);
  await runAfterResponse('sign-up', () => mailSignUp({ ...input, passwordHash }));
}

/** The link to finish (a new address) or a note to the holder (an address with an account). */
async function mailSignUp(input: Omit<SignUpRequest, 'password'> & { passwordHash: string }) {
  const existing = await findUserByEmail(input.email);
  await inTransaction(async (tx) => {
    if (existing) {
      await enqueueMail(tx, {
        kind: 'sign-up-existing-account',
        ...signUpExistingAccountMail({
          to: existing.email,
          name: existing.name,
          signInLink: `${appUrl()}/sign-in`,
          resetLink: `${appUrl()}/forgot-password`,
        }),
      });
      return;
    }
    const { token, tokenHash } = newToken();
    await insertPendingSignUp(tx, {
      email: input.email,
      name: input.name,
      organizationName: input.organizationName,
      passwordHash: input.passwordHash,
      tokenHash,
      expiresAt: new Date(Date.now() + SIGN_UP_LIFETIME_MS),
    });
    await enqueueMail(tx, {
      kind: 'sign-up',
      ...signUpLinkMail({
        to: input.email,
        name: input.name,
        organizationName: input.organizationName,
        link: `${appUrl()}/sign-up/finish?token=${token}`,
      }),
    });
  });
}

const AGAIN = 'Sign up again to get a new link.';

/** Only the holder of the link reads this: the mail went to the address itself. */
const accountExists = () =>
  new AppError(
    'account_exists',
    'This address already has an account. Sign in instead, or use “Forgot password?”.',
  );

/**
 * The link of the sign-up mail (each works once, for 24 hours): the user, a new organization, the
 * admin membership and the audit row in one transaction, with the address confirmed; then the
 * session.
 */
export async function finishSignUp(token: string): Promise<void> {
  const userId = newId();
  const organizationId = newId();
  try {
    await inTransaction(async (tx) => {
      const pending = token ? await lockPendingSignUp(tx, hashToken(token)) : null;
      const status = tokenStatus(pending);
      if (status === 'unknown' || !pending) {
        throw new AppError(
          'token_not_found',
          `This link is not valid; check that you opened the whole link from the mail. ${AGAIN}`,
        );
      }
      if (status === 'used') {
        throw new AppError(
          'token_used',
          'This link was already used: your account exists. Sign in with your e-mail and password.',
        );
      }
      if (status === 'expired') {
        throw new AppError(
          'token_expired',
          `This link has expired (links last 24 hours). ${AGAIN}`,
        );
      }
      const now = new Date();
      await closePendingSignUps(tx, pending.email, now);
      if (await findUserByEmail(pending.email, tx)) throw accountExists();
      await insertUser(tx, {
        id: userId,
        email: pending.email,
        name: pending.name,
        passwordHash: pending.passwordHash,
        emailVerifiedAt: now,
      });
      await insertOrganization(tx, { id: organizationId, name: pending.organizationName });
      await insertMembership(tx, { userId, organizationId, role: 'admin' });
      await recordAudit(tx, {
        actorUserId: userId,
        organizationId,
        action: 'organization.create',
        entityType: 'organization',
        entityId: organizationId,
        after: { name: pending.organizationName, createdBy: pending.email },
      });
    });
  } catch (error) {
    // An account made for the address at the same moment (an invitation): the unique index decides.
    if (violatedUniqueConstraint(error) === 'users_email_unique') throw accountExists();
    throw error;
  }
  await startSession(userId, organizationId);
}
