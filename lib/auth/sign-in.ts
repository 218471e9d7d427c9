import 'server-only';
import { findUserByEmail } from '@/db/queries/users';
import {
  beginPasswordAttempt,
  beginSignUpAttempt,
  markAttemptSucceeded,
} from '@/db/queries/sign-in-attempts';
import { decoyPasswordHash, verifyPassword } from './password';
import {
  SIGN_IN_LIMITS,
  SIGN_UP_LIMITS,
  addressKey,
  passwordAttemptDecision,
  signUpDecision,
  waitInWords,
  windowStart,
} from './throttle';

export { SIGN_IN_LIMITS, SIGN_UP_LIMITS } from './throttle';

export type SignInOutcome =
  | { ok: true; userId: string }
  | {
      ok: false;
      code: 'invalid_credentials' | 'too_many_attempts';
      message: string;
      retryAfterSeconds?: number;
    };

export const INVALID_CREDENTIALS_MESSAGE =
  'That e-mail and password do not match an account. Check both and try again.';

export function tooManyAttemptsMessage(seconds: number): string {
  return `Too many failed sign-in attempts. Wait ${waitInWords(seconds)} and try again; if it was not you, tell an admin.`;
}

/**
 * Checks an e-mail and password (sign-in, and the password that signs a review). The answer is
 * the same for an unknown e-mail and a wrong password; attempts are throttled per account, per
 * address and per account from unknown addresses, never locking the account
 * (lib/auth/throttle.ts).
 */
export async function checkCredentials(input: {
  email: string;
  password: string;
  ipAddress: string;
}): Promise<SignInOutcome> {
  const now = new Date();
  const { decision, attemptId } = await beginPasswordAttempt({
    email: input.email,
    address: addressKey(input.ipAddress),
    now,
    since: windowStart(now, SIGN_IN_LIMITS.windowMinutes),
    knownSince: new Date(now.getTime() - SIGN_IN_LIMITS.knownAddressDays * 86_400_000),
    decide: (history) => passwordAttemptDecision(now, history),
  });
  if (!decision.allowed) {
    return {
      ok: false,
      code: 'too_many_attempts',
      message: tooManyAttemptsMessage(decision.retryAfterSeconds),
      retryAfterSeconds: decision.retryAfterSeconds,
    };
  }
  const user = await findUserByEmail(input.email);
  const valid = user
    ? await verifyPassword(user.passwordHash, input.password)
    : (await verifyPassword(await decoyPasswordHash(), input.password), false);
  if (!user || !valid) {
    return { ok: false, code: 'invalid_credentials', message: INVALID_CREDENTIALS_MESSAGE };
  }
  if (attemptId !== null) await markAttemptSucceeded(attemptId);
  return { ok: true, userId: user.id };
}

/** May this address create another account now? Records the sign-up when it may. */
export async function admitSignUp(input: {
  email: string;
  ipAddress: string;
}): Promise<{ ok: true } | { ok: false; message: string; retryAfterSeconds: number }> {
  const now = new Date();
  const decision = await beginSignUpAttempt({
    email: input.email,
    address: addressKey(input.ipAddress),
    now,
    since: windowStart(now, SIGN_UP_LIMITS.windowMinutes),
    decide: (history) => signUpDecision(now, history),
  });
  if (decision.allowed) return { ok: true };
  return {
    ok: false,
    message: `Too many accounts were created from your network just now. Wait ${waitInWords(decision.retryAfterSeconds)} and try again.`,
    retryAfterSeconds: decision.retryAfterSeconds,
  };
}
