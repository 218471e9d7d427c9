import 'server-only';
import { findUserByEmail } from '@/db/queries/users';
import {
  insertSignInAttempt,
  lockPasswordAttempts,
  lockSignUpAttempts,
  markAttemptSucceeded,
  passwordHistory,
  signUpHistory,
} from '@/db/queries/sign-in-attempts';
import { inTransaction } from '@/db/queries/transaction';
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
  const address = addressKey(input.ipAddress);
  // Under the account's and the address's locks: the history is read and, when the attempt is
  // allowed, it is recorded at once as a failure, so it counts before the slow check ends.
  const { decision, attemptId } = await inTransaction(async (tx) => {
    await lockPasswordAttempts(tx, input.email, address);
    const history = await passwordHistory(tx, {
      email: input.email,
      address,
      since: windowStart(now, SIGN_IN_LIMITS.windowMinutes),
      knownSince: new Date(now.getTime() - SIGN_IN_LIMITS.knownAddressDays * 86_400_000),
    });
    const decision = passwordAttemptDecision(now, history);
    if (!decision.allowed) return { decision, attemptId: null };
    const attemptId = await insertSignInAttempt(tx, {
      email: input.email,
      ipAddress: address,
      succeeded: false,
      kind: 'password',
      createdAt: now,
    });
    return { decision, attemptId };
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
  const address = addressKey(input.ipAddress);
  const decision = await inTransaction(async (tx) => {
    await lockSignUpAttempts(tx, address);
    const history = await signUpHistory(tx, {
      address,
      since: windowStart(now, SIGN_UP_LIMITS.windowMinutes),
    });
    const decision = signUpDecision(now, history);
    if (decision.allowed) {
      await insertSignInAttempt(tx, {
        email: input.email,
        ipAddress: address,
        succeeded: true,
        kind: 'sign-up',
        createdAt: now,
      });
    }
    return decision;
  });
  if (decision.allowed) return { ok: true };
  return {
    ok: false,
    message: `Too many accounts were created from your network just now. Wait ${waitInWords(decision.retryAfterSeconds)} and try again.`,
    retryAfterSeconds: decision.retryAfterSeconds,
  };
}
