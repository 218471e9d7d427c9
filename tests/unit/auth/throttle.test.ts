import { describe, expect, it } from 'vitest';
import { SIGN_IN_LIMITS, passwordAttemptDecision, signUpDecision, waitInWords } from '@/lib/auth/throttle';

const now = new Date('2026-05-04T12:00:00Z');
const ago = (seconds: number) => new Date(now.getTime() - seconds * 1000);
const quiet = {
  pairFailures: 0,
  pairLastFailureAt: null,
  addressFailures: 0,
  addressOldestFailureAt: null,
  accountFailures: 0,
  accountLastFailureAt: null,
  knownAddress: false,
};

describe('passwordAttemptDecision', () => {
  it('lets the first failures of a pair through, then doubles the wait', () => {
    expect(passwordAttemptDecision(now, { ...quiet, pairFailures: 2, pairLastFailureAt: ago(0) })).toEqual({
      allowed: true,
    });
    expect(passwordAttemptDecision(now, { ...quiet, pairFailures: 3, pairLastFailureAt: ago(0) })).toEqual({
      allowed: false,
      retryAfterSeconds: 1,
      reason: 'pair',
    });
    expect(passwordAttemptDecision(now, { ...quiet, pairFailures: 7, pairLastFailureAt: ago(10) })).toEqual({
      allowed: false,
      retryAfterSeconds: 6,
      reason: 'pair',
    });
    expect(passwordAttemptDecision(now, { ...quiet, pairFailures: 7, pairLastFailureAt: ago(16) })).toEqual({
      allowed: true,
    });
    const capped = passwordAttemptDecision(now, { ...quiet, pairFailures: 40, pairLastFailureAt: ago(0) });
    expect(capped).toMatchObject({ retryAfterSeconds: SIGN_IN_LIMITS.pairMaxDelaySeconds });
  });

  it('pauses an address that failed too often, unless the account knows it', () => {
    const busy = { ...quiet, addressFailures: 30, addressOldestFailureAt: ago(600) };
    expect(passwordAttemptDecision(now, busy)).toEqual({ allowed: false, retryAfterSeconds: 300, reason: 'address' });
    expect(passwordAttemptDecision(now, { ...busy, knownAddress: true })).toEqual({ allowed: true });
  });

  it('slows an account guessed from many addresses for unknown addresses only, for a minute at most', () => {
    const spread = { ...quiet, accountFailures: 50, accountLastFailureAt: ago(0) };
    expect(passwordAttemptDecision(now, spread)).toEqual({ allowed: false, retryAfterSeconds: 60, reason: 'account' });
    expect(passwordAttemptDecision(now, { ...spread, knownAddress: true })).toEqual({ allowed: true });
    expect(passwordAttemptDecision(now, { ...spread, accountLastFailureAt: ago(61) })).toEqual({ allowed: true });
  });

  it('never refuses for longer than the longest wait', () => {
    const worst = passwordAttemptDecision(now, {
      pairFailures: 1000,
      pairLastFailureAt: ago(0),
      addressFailures: 1000,
      addressOldestFailureAt: ago(0),
      accountFailures: 1000,
      accountLastFailureAt: ago(0),
      knownAddress: false,
    });
    expect(worst.allowed === false && worst.retryAfterSeconds).toBeLessThanOrEqual(15 * 60);
  });
});

describe('signUpDecision', () => {
  it('allows ten sign-ups an hour from one address', () => {
    expect(signUpDecision(now, { signUps: 9, oldestAt: ago(10) })).toEqual({ allowed: true });
    expect(signUpDecision(now, { signUps: 10, oldestAt: ago(3000) })).toEqual({
      allowed: false,
      retryAfterSeconds: 600,
      reason: 'address',
    });
  });
});

describe('waitInWords', () => {
  it.each([
    [1, '1 second'],
    [8, '8 seconds'],
    [60, '1 minute'],
    [61, '2 minutes'],
  ])('%i s → %s', (seconds, words) => {
    expect(waitInWords(seconds)).toBe(words);
  });
});
