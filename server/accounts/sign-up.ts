import 'server-only';
import { getDb } from '@/db/client';
import { closePendingSignUps, insertPendingSignUp, lockPendingSignUp } from '@/db/queries/sign-ups';
import { createUserWithOrganization, findUserByEmail } from '@/db/queries/users';
import { HttpError } from '@/lib/api/errors';
import { hashToken, newToken, SIGN_UP_LIFETIME_MS } from '@/lib/auth/tokens';
import { appUrl } from '@/lib/config';
import { signUpExistingAccountMail, signUpLinkMail } from '@/lib/email/messages';
import { enqueueMail } from '@/lib/email/queue';

/**
 * Sign-up in two steps, so the form answers the same whether or not the address has an account:
 * startSignUp mails a link to a new address (nothing is created yet) or, to an address that
 * already has an account, a note to its holder; finishSignUp, from the link, creates the user,
 * the organization and the admin membership, with the address confirmed.
 */
export async function startSignUp(input: {
  email: string;
  name: string;
  organizationName: string;
  passwordHash: string;
}): Promise<void> {
  const existing = await findUserByEmail(input.email);
  await getDb().transaction(async (tx) => {
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

/** Creates the account of a sign-up link; each link works once, for 24 hours. */
export async function finishSignUp(token: string): Promise<{ userId: string; organizationId: string }> {
  return getDb().transaction(async (tx) => {
    const pending = token ? await lockPendingSignUp(tx, hashToken(token)) : null;
    if (!pending) {
      throw new HttpError(404, 'token_not_found', `This link is not valid; check that you opened the whole link from the mail. ${AGAIN}`);
    }
    if (pending.usedAt) {
      throw new HttpError(410, 'token_used', 'This link was already used: your account exists. Sign in with your e-mail and password.');
    }
    if (pending.expiresAt.getTime() <= Date.now()) {
      throw new HttpError(410, 'token_expired', `This link has expired (links last 24 hours). ${AGAIN}`);
    }
    const now = new Date();
    await closePendingSignUps(tx, pending.email, now);
    if (await findUserByEmail(pending.email)) {
      throw new HttpError(409, 'account_exists', 'This address already has an account. Sign in instead, or use “Forgot password?”.');
    }
    return createUserWithOrganization(
      {
        email: pending.email,
        name: pending.name,
        organizationName: pending.organizationName,
        passwordHash: pending.passwordHash,
        emailVerifiedAt: now,
      },
      tx,
    );
  });
}
