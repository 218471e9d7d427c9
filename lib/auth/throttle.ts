/**
 * How password guessing is slowed (sign-in and the password that signs a review share one
 * budget), and how often an address may sign up. The decisions are pure functions of the stored
 * attempts (db/queries/sign-in-attempts.ts); lib/auth/sign-in.ts applies them.
 *
 * The aims: a guesser is slowed per account and per address, and a stranger cannot lock anyone
 * out. So nothing locks an account:
 * - one account from one address: the first few failures are free, then each further try waits
 *   a delay that doubles (1 s, 2 s, 4 s, … up to 5 min) until that pair succeeds;
 * - one address, all accounts together: after 30 failures in 15 minutes the address waits until
 *   the oldest of them is 15 minutes old — except for accounts that have signed in from that
 *   address before (a shared office address stays usable for its own people);
 * - one account from addresses it has never signed in from: after 10 failures in 15 minutes such
 *   addresses wait a delay doubling up to 1 min between tries, so a distributed guesser gets about
 *   one guess a minute while the owner, from an address they signed in from in the last 90
 *   days, is not slowed at all, and from a new address waits a minute at most.
 * Every attempt that is let through is recorded as a failure before the (slow) password check
 * and turned into a success after it, under per-account and per-address locks, so parallel
 * guesses count at once.
 */
import type { PasswordAttemptHistory } from '@/db/queries/sign-in-attempts';

export const SIGN_IN_LIMITS = {
  windowMinutes: 15,
  /** Failures of one account from one address before tries wait. */
  pairFreeFailures: 3,
  pairMaxDelaySeconds: 300,
  /** Failures from one address (all accounts) in the window before it waits out the window. */
  perAddress: 30,
  /** Failures of one account from unknown addresses in the window before such tries wait. */
  accountFreeFailures: 10,
  accountMaxDelaySeconds: 60,
  /** An address the account signed in from within this many days is known. */
  knownAddressDays: 90,
} as const;

export const SIGN_UP_LIMITS = {
  windowMinutes: 60,
  /** New accounts one address may create in the window (a lab signs up once). */
  perAddress: 10,
} as const;

export type ThrottleDecision =
  | { allowed: true }
  | { allowed: false; retryAfterSeconds: number; reason: 'pair' | 'address' | 'account' };

const MINUTE = 60_000;

/** Seconds left of a wait that started at `from` and lasts `seconds`, or 0. */
function remaining(now: Date, from: Date | null, seconds: number): number {
  if (!from) return 0;
  return Math.max(0, Math.ceil((from.getTime() + seconds * 1000 - now.getTime()) / 1000));
}

/**
 * Seconds still to wait after `failures` (the first `free` cost nothing, then 1 s doubling up to
 * `max`), counted from the last failure; 0 when none.
 */
function doublingWait(now: Date, failures: number, last: Date | null, free: number, max: number): number {
  if (failures < free) return 0;
  return remaining(now, last, Math.min(max, 2 ** (failures - free)));
}

export function passwordAttemptDecision(now: Date, history: PasswordAttemptHistory): ThrottleDecision {
  const limits = SIGN_IN_LIMITS;
  const refuse = (wait: number, reason: 'pair' | 'address' | 'account'): ThrottleDecision | null =>
    wait > 0 ? { allowed: false, retryAfterSeconds: wait, reason } : null;
  const pair = doublingWait(
    now,
    history.pairFailures,
    history.pairLastFailureAt,
    limits.pairFreeFailures,
    limits.pairMaxDelaySeconds,
  );
  if (pair > 0 || history.knownAddress) return refuse(pair, 'pair') ?? { allowed: true };
  const address =
    history.addressFailures >= limits.perAddress
      ? remaining(now, history.addressOldestFailureAt, limits.windowMinutes * 60)
      : 0;
  const account = doublingWait(
    now,
    history.accountFailures,
    history.accountLastFailureAt,
    limits.accountFreeFailures,
    limits.accountMaxDelaySeconds,
  );
  return refuse(address, 'address') ?? refuse(account, 'account') ?? { allowed: true };
}

export function signUpDecision(
  now: Date,
  history: { signUps: number; oldestAt: Date | null },
): ThrottleDecision {
  if (history.signUps < SIGN_UP_LIMITS.perAddress) return { allowed: true };
  const wait = remaining(now, history.oldestAt, SIGN_UP_LIMITS.windowMinutes * 60);
  return wait > 0
    ? { allowed: false, retryAfterSeconds: wait, reason: 'address' }
    : { allowed: true };
}

/** Start of the counting window before `now`. */
export function windowStart(now: Date, minutes: number): Date {
  return new Date(now.getTime() - minutes * MINUTE);
}

/** "8 seconds", "2 minutes": how long to wait, for messages. */
export function waitInWords(seconds: number): string {
  if (seconds < 60) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minute${minutes === 1 ? '' : 's'}`;
}

/**
 * The key an address is counted under: an IPv4 address as it is, an IPv6 address by its /64
 * network (one subscriber usually gets a whole /64, so counting single addresses would let one
 * guesser rotate through billions of them).
 */
export function addressKey(address: string): string {
  if (!address.includes(':')) return address;
  const [head = '', tail = ''] = address.split('::');
  const left = head ? head.split(':') : [];
  const right = tail ? tail.split(':') : [];
  const groups = address.includes('::')
    ? [...left, ...Array(8 - left.length - right.length).fill('0'), ...right]
    : left;
  if (groups.length !== 8) return address;
  return `${groups
    .slice(0, 4)
    .map((g) => (Number.parseInt(g, 16) || 0).toString(16))
    .join(':')}::/64`;
}
