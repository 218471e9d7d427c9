import 'server-only';
import { eq, sql } from 'drizzle-orm';
import { signInAttempts } from '../schema';
import { database, type Executor } from './transaction';

export type AttemptKind = 'password' | 'sign-up';

/** What the throttle (lib/auth/throttle.ts) weighs before a password is checked. */
export type PasswordAttemptHistory = {
  /** Failures of this account from this address since their last success, in the window. */
  pairFailures: number;
  pairLastFailureAt: Date | null;
  /** Failures from this address, all accounts together, in the window. */
  addressFailures: number;
  addressOldestFailureAt: Date | null;
  /** Failures of this account from addresses it never signed in from, in the window. */
  accountFailures: number;
  accountLastFailureAt: Date | null;
  /** The account signed in from this address within the known-address period. */
  knownAddress: boolean;
};

/**
 * Serialises the attempts on one account and on one address until the transaction ends
 * (advisory locks, taken in this order everywhere), so parallel guesses cannot all read the same
 * counts.
 */
export async function lockPasswordAttempts(
  tx: Executor,
  email: string,
  address: string,
): Promise<void> {
  await tx.execute(
    sql`select pg_advisory_xact_lock(hashtextextended(${`sign-in:account:${email}`}, 0))`,
  );
  await tx.execute(
    sql`select pg_advisory_xact_lock(hashtextextended(${`sign-in:address:${address}`}, 0))`,
  );
}

/** The failures the throttle weighs, for an account from an address (lib/auth/throttle.ts). */
export async function passwordHistory(
  tx: Executor,
  input: { email: string; address: string; since: Date; knownSince: Date },
): Promise<PasswordAttemptHistory> {
  const { email, address } = input;
  // Raw SQL parameters go to the driver as they are; a timestamp travels as ISO text.
  const since = sql`${input.since.toISOString()}::timestamptz`;
  const knownSince = sql`${input.knownSince.toISOString()}::timestamptz`;
  const rows = await tx.execute<{
    pair_failures: number;
    pair_last_failure_at: string | null;
    address_failures: number;
    address_oldest_failure_at: string | null;
    account_failures: number;
    account_last_failure_at: string | null;
    known_address: boolean;
  }>(sql`
    with recent as (
      select ip_address, succeeded, created_at from sign_in_attempts
      where email = ${email} and kind = 'password' and created_at > ${since}
    ),
    known as (
      select distinct ip_address from sign_in_attempts
      where email = ${email} and kind = 'password' and succeeded and created_at > ${knownSince}
    ),
    pair_success as (
      select max(created_at) as at from recent where ip_address = ${address} and succeeded
    ),
    by_address as (
      select count(*)::int as failures, min(created_at) as oldest from sign_in_attempts
      where ip_address = ${address} and kind = 'password' and not succeeded and created_at > ${since}
    )
    select
      (select count(*)::int from recent, pair_success
        where ip_address = ${address} and not succeeded
          and (pair_success.at is null or created_at > pair_success.at)) as pair_failures,
      (select max(created_at) from recent where ip_address = ${address} and not succeeded)
        as pair_last_failure_at,
      (select failures from by_address) as address_failures,
      (select oldest from by_address) as address_oldest_failure_at,
      (select count(*)::int from recent
        where not succeeded and ip_address not in (select ip_address from known)) as account_failures,
      (select max(created_at) from recent
        where not succeeded and ip_address not in (select ip_address from known))
        as account_last_failure_at,
      exists (select 1 from known where ip_address = ${address}) as known_address
  `);
  const row = rows[0]!;
  const date = (value: string | null) => (value === null ? null : new Date(value));
  return {
    pairFailures: row.pair_failures,
    pairLastFailureAt: date(row.pair_last_failure_at),
    addressFailures: row.address_failures,
    addressOldestFailureAt: date(row.address_oldest_failure_at),
    accountFailures: row.account_failures,
    accountLastFailureAt: date(row.account_last_failure_at),
    knownAddress: row.known_address,
  };
}

/** Records an attempt; a password attempt is recorded as failed until markAttemptSucceeded. */
export async function insertSignInAttempt(
  tx: Executor,
  row: {
    email: string;
    ipAddress: string;
    succeeded: boolean;
    kind: AttemptKind;
    createdAt: Date;
  },
): Promise<number> {
  const [inserted] = await tx
    .insert(signInAttempts)
    .values(row)
    .returning({ id: signInAttempts.id });
  return inserted!.id;
}

/** The password was right: the attempt recorded as failed becomes a success. */
export async function markAttemptSucceeded(attemptId: number): Promise<void> {
  await database()
    .update(signInAttempts)
    .set({ succeeded: true })
    .where(eq(signInAttempts.id, attemptId));
}

/** Serialises the sign-ups from one address until the transaction ends. */
export async function lockSignUpAttempts(tx: Executor, address: string): Promise<void> {
  await tx.execute(
    sql`select pg_advisory_xact_lock(hashtextextended(${`sign-up:address:${address}`}, 0))`,
  );
}

/** Sign-ups from one address since `since`, and when the oldest of them was. */
export async function signUpHistory(
  tx: Executor,
  input: { address: string; since: Date },
): Promise<{ signUps: number; oldestAt: Date | null }> {
  const [row] = await tx.execute<{ n: number; oldest: string | null }>(sql`
    select count(*)::int as n, min(created_at) as oldest from sign_in_attempts
    where ip_address = ${input.address} and kind = 'sign-up'
      and created_at > ${input.since.toISOString()}::timestamptz`);
  return { signUps: row!.n, oldestAt: row!.oldest === null ? null : new Date(row!.oldest) };
}
