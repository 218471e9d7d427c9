import 'server-only';
import { findUserByEmail } from '@/db/queries/users';
import { countRecentFailures, recordSignInAttempt } from '@/db/queries/sign-in-attempts';
import { decoyPasswordHash, verifyPassword } from './password';

/** Failed attempts allowed per window before sign-in is paused. */
export const SIGN_IN_LIMITS = {
  windowMinutes: 15,
  perAccount: 5,
  perAddress: 30,
} as const;

export type SignInOutcome =
  | { ok: true; userId: string }
  | { ok: false; code: 'invalid_credentials' | 'too_many_attempts'; message: string };

export const INVALID_CREDENTIALS_MESSAGE =
  'That e-mail and password do not match an account. Check both and try again.';

/**
 * Checks an e-mail and password. The answer is the same for an unknown e-mail and a wrong
 * password; attempts are stored and limited per account and per network address.
 */
export async function checkCredentials(input: {
  email: string;
  password: string;
  ipAddress: string;
}): Promise<SignInOutcome> {
  const since = new Date(Date.now() - SIGN_IN_LIMITS.windowMinutes * 60_000);
  const failures = await countRecentFailures({ email: input.email, ipAddress: input.ipAddress, since });
  if (failures.byEmail >= SIGN_IN_LIMITS.perAccount || failures.byAddress >= SIGN_IN_LIMITS.perAddress) {
    return {
      ok: false,
      code: 'too_many_attempts',
      message: `Too many failed sign-in attempts. Wait ${SIGN_IN_LIMITS.windowMinutes} minutes and try again, or ask an admin to check your account.`,
    };
  }
  const user = await findUserByEmail(input.email);
  const valid = user
    ? await verifyPassword(user.passwordHash, input.password)
    : (await verifyPassword(await decoyPasswordHash(), input.password), false);
  await recordSignInAttempt({ email: input.email, ipAddress: input.ipAddress, succeeded: valid });
  if (!user || !valid) {
    return { ok: false, code: 'invalid_credentials', message: INVALID_CREDENTIALS_MESSAGE };
  }
  return { ok: true, userId: user.id };
}
