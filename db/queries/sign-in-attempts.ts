import 'server-only';
import { eq, sql } from 'drizzle-orm';
import { getDb } from '../client';
import { signInAttempts } from '../schema';

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

type Executor = Pick<ReturnType<typeof getDb>, 'execute'>;

/**
 * Serialises the attempts on one account and on one address (transaction-scoped advisory
 * locks, taken in this order everywhere), so parallel guesses cannot all read the same counts.
 */
async function lockAttempts(tx: Executor, email: string, address: string): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`sign-in:account:${email}`}, 0))`);
  await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`sign-in:address:${address}`}, 0))`);
}

async function passwordHistory(
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

/**
 * Reads the history of an account and an address and, when `decide` allows the attempt, records
 * it at once as a failure (so it counts before the slow password check ends); all under the
 * locks of lockAttempts. Returns the decision and the recorded attempt's id.
 */
export async function beginPasswordAttempt<D extends { allowed: boolean }>(input: {
  email: string;
  address: string;
  now: Date;
  since: Date;
  knownSince: Date;
  decide: (history: PasswordAttemptHistory) => D;
}): Promise<{ decision: D; attemptId: number | null }> {
  return getDb().transaction(async (tx) => {
    await lockAttempts(tx, input.email, input.address);
    const decision = input.decide(await passwordHistory(tx, input));
    if (!decision.allowed) return { decision, attemptId: null };
    const [row] = await tx
      .insert(signInAttempts)
      .values({
        email: input.email,
        ipAddress: input.address,
        succeeded: false,
        kind: 'password',
        createdAt: input.now,
      })
      .returning({ id: signInAttempts.id });
    return { decision, attemptId: row!.id };
  });
}

/** The password was right: the attempt recorded by beginPasswordAttempt becomes a success. */
export async function markAttemptSucceeded(attemptId: number): Promise<void> {
  await getDb()
    .update(signInAttempts)
    .set({ succeeded: true })
    .where(eq(signInAttempts.id, attemptId));
}

/**
 * Sign-ups from one address since `since`; when `decide` allows one more, it is recorded. Under
 * the address's lock, like password attempts.
 */
export async function beginSignUpAttempt<D extends { allowed: boolean }>(input: {
  email: string;
  address: string;
  now: Date;
  since: Date;
  decide: (history: { signUps: number; oldestAt: Date | null }) => D;
}): Promise<D> {
  return getDb().transaction(async (tx) => {
    await tx.execute(
      sql`select pg_advisory_xact_lock(hashtextextended(${`sign-up:address:${input.address}`}, 0))`,
    );
    const [row] = await tx.execute<{ n: number; oldest: string | null }>(sql`
      select count(*)::int as n, min(created_at) as oldest from sign_in_attempts
      where ip_address = ${input.address} and kind = 'sign-up'
        and created_at > ${input.since.toISOString()}::timestamptz`);
    const decision = input.decide({
      signUps: row!.n,
      oldestAt: row!.oldest === null ? null : new Date(row!.oldest),
    });
    if (decision.allowed) {
      await tx.insert(signInAttempts).values({
        email: input.email,
        ipAddress: input.address,
        succeeded: true,
        kind: 'sign-up',
        createdAt: input.now,
      });
    }
    return decision;
  });
}
