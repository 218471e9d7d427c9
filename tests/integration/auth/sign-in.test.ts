import { randomBytes } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { signInAttempts } from '@/db/schema';
import { closeMailQueue } from '@/server/mail/queue';
import { signIn } from '@/app/(auth)/actions';
import { checkCredentials, INVALID_CREDENTIALS_MESSAGE, SIGN_IN_LIMITS } from '@/lib/auth/sign-in';
import { addressKey } from '@/lib/auth/throttle';
import { POST as decideReview } from '@/app/api/reviews/[id]/decision/route';
import { submitForReview } from '@/server/reviews/submit';
import { apiRequest, requestState, simulateRequest } from '../support/request';
import { insertBatch, insertCoating, insertDrop, insertSample } from '../support/seed';
import { createMember, createOrganization, TEST_PASSWORD, uniqueEmail } from '../support/fixtures';
import { form } from '../team/support';

const address = () => `10.9.${randomBytes(1)[0]}.${randomBytes(1)[0]}`;
let email: string;

beforeAll(async () => {
  const lab = await createOrganization();
  email = (await createMember(lab.id, 'analyst')).email;
});

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

async function newAccount(role: 'viewer' | 'reviewer' = 'viewer'): Promise<string> {
  const lab = await createOrganization();
  return (await createMember(lab.id, role)).email;
}

/** Failed attempts as if they had happened `secondsAgo` before now. */
async function pastFailures(rows: { email: string; ipAddress: string }[], secondsAgo: number) {
  const createdAt = new Date(Date.now() - secondsAgo * 1000);
  await getDb()
    .insert(signInAttempts)
    .values(rows.map((row) => ({ ...row, succeeded: false, kind: 'password', createdAt })));
}

describe('checkCredentials', () => {
  it('accepts the right password', async () => {
    const outcome = await checkCredentials({ email, password: TEST_PASSWORD, ipAddress: address() });
    expect(outcome.ok).toBe(true);
  });

  it('says exactly the same for an unknown e-mail and a wrong password', async () => {
    const wrongPassword = await checkCredentials({ email, password: 'not the password', ipAddress: address() });
    const unknownEmail = await checkCredentials({
      email: uniqueEmail('nobody'),
      password: TEST_PASSWORD,
      ipAddress: address(),
    });
    expect(wrongPassword).toEqual(unknownEmail);
    expect(wrongPassword).toEqual({
      ok: false,
      code: 'invalid_credentials',
      message: INVALID_CREDENTIALS_MESSAGE,
    });
  });

  it('slows one address guessing one account: each try waits, the right password too, but only for a while', async () => {
    const target = await newAccount();
    const guesser = address();
    // Six failures a second ago: the 4th to 6th doubled the wait to 8 s.
    await pastFailures(Array.from({ length: 6 }, () => ({ email: target, ipAddress: guesser })), 1);
    const slowed = await checkCredentials({ email: target, password: TEST_PASSWORD, ipAddress: guesser });
    expect(slowed).toMatchObject({ ok: false, code: 'too_many_attempts' });
    expect(slowed.ok === false && slowed.retryAfterSeconds).toBeGreaterThanOrEqual(6);
    expect(slowed.ok === false && slowed.message).toMatch(/Wait \d+ seconds/);
    // Nothing was locked: once the wait is over the right password works.
    const later = await newAccount();
    await pastFailures(Array.from({ length: 6 }, () => ({ email: later, ipAddress: guesser })), 9);
    expect((await checkCredentials({ email: later, password: TEST_PASSWORD, ipAddress: guesser })).ok).toBe(true);
  });

  it("five wrong passwords from a stranger's address do not stop the real user", async () => {
    const target = await newAccount('reviewer');
    const home = address();
    expect((await checkCredentials({ email: target, password: TEST_PASSWORD, ipAddress: home })).ok).toBe(true);
    const stranger = address();
    for (let i = 0; i < 5; i++) {
      const outcome = await checkCredentials({ email: target, password: `guess ${i}`, ipAddress: stranger });
      expect(outcome.ok).toBe(false);
    }
    expect((await checkCredentials({ email: target, password: TEST_PASSWORD, ipAddress: home })).ok).toBe(true);
    // Nor from an address the user never used before.
    expect((await checkCredentials({ email: target, password: TEST_PASSWORD, ipAddress: address() })).ok).toBe(
      true,
    );
  });

  it('a guesser spread over many addresses slows the account for unknown addresses, never for the known one', async () => {
    const target = await newAccount('reviewer');
    const home = address();
    expect((await checkCredentials({ email: target, password: TEST_PASSWORD, ipAddress: home })).ok).toBe(true);
    const spread = Array.from({ length: SIGN_IN_LIMITS.accountFreeFailures + 2 }, (_, i) => ({
      email: target,
      ipAddress: `10.66.${i}.${randomBytes(1)[0]}`,
    }));
    await pastFailures(spread, 0.5);
    const elsewhere = await checkCredentials({ email: target, password: TEST_PASSWORD, ipAddress: address() });
    expect(elsewhere).toMatchObject({ ok: false, code: 'too_many_attempts' });
    expect(elsewhere.ok === false && elsewhere.retryAfterSeconds).toBeLessThanOrEqual(
      SIGN_IN_LIMITS.accountMaxDelaySeconds,
    );
    expect((await checkCredentials({ email: target, password: TEST_PASSWORD, ipAddress: home })).ok).toBe(true);
  });

  it('pauses a network address that tries many accounts', async () => {
    const ipAddress = address();
    for (let i = 0; i < SIGN_IN_LIMITS.perAddress; i++) {
      await checkCredentials({ email: uniqueEmail('spray'), password: 'x', ipAddress });
    }
    const blocked = await checkCredentials({ email, password: TEST_PASSWORD, ipAddress });
    expect(blocked).toMatchObject({ ok: false, code: 'too_many_attempts' });
    const otherAddress = await checkCredentials({ email, password: TEST_PASSWORD, ipAddress: address() });
    expect(otherAddress.ok).toBe(true);
  });

  it('an address that sprays accounts still lets its own known users in (a shared office address)', async () => {
    const office = address();
    const colleague = await newAccount();
    expect((await checkCredentials({ email: colleague, password: TEST_PASSWORD, ipAddress: office })).ok).toBe(true);
    await pastFailures(
      Array.from({ length: SIGN_IN_LIMITS.perAddress + 1 }, () => ({ email: uniqueEmail('spray'), ipAddress: office })),
      1,
    );
    expect((await checkCredentials({ email: uniqueEmail('spray'), password: 'x', ipAddress: office }))).toMatchObject({
      code: 'too_many_attempts',
    });
    expect((await checkCredentials({ email: colleague, password: TEST_PASSWORD, ipAddress: office })).ok).toBe(true);
  });

  it('counts parallel guesses at once: a burst from one address cannot all get through', async () => {
    const target = await newAccount();
    const guesser = address();
    const outcomes = await Promise.all(
      Array.from({ length: 8 }, (_, i) => checkCredentials({ email: target, password: `burst ${i}`, ipAddress: guesser })),
    );
    const checked = outcomes.filter((o) => o.ok === false && o.code === 'invalid_credentials');
    expect(checked.length).toBeLessThanOrEqual(SIGN_IN_LIMITS.pairFreeFailures + 1);
    expect(outcomes.some((o) => o.ok === false && o.code === 'too_many_attempts')).toBe(true);
  });

  it('counts an IPv6 guesser by its /64, however it rotates the rest', async () => {
    const target = await newAccount();
    const network = `2001:db8:${randomBytes(2).toString('hex')}:${randomBytes(2).toString('hex')}`;
    const anywhere = () => `${network}:${randomBytes(2).toString('hex')}::${randomBytes(2).toString('hex')}`;
    await pastFailures(
      Array.from({ length: 6 }, () => ({ email: target, ipAddress: addressKey(anywhere()) })),
      1,
    );
    const outcome = await checkCredentials({ email: target, password: TEST_PASSWORD, ipAddress: anywhere() });
    expect(outcome).toMatchObject({ ok: false, code: 'too_many_attempts' });
  });
});

describe('the sign-in form counts attempts by the address the server saw', () => {
  it('a client rotating X-Forwarded-For is still one address', async () => {
    const target = await newAccount();
    const peer = `10.77.${randomBytes(1)[0]}.${randomBytes(1)[0]}`;
    for (let i = 0; i < 4; i++) {
      simulateRequest({ sessionId: null, clientAddress: peer });
      requestState.headers.set('x-forwarded-for', `198.51.100.${i + 1}`);
      requestState.headers.set('x-real-ip', `198.51.100.${i + 1}`);
      const state = await signIn({}, form({ email: target, password: `guess ${i}` }));
      expect(state.code === 'invalid_credentials' || state.code === 'too_many_attempts').toBe(true);
    }
    const rows = await getDb()
      .select({ ipAddress: signInAttempts.ipAddress })
      .from(signInAttempts)
      .where(and(eq(signInAttempts.email, target), eq(signInAttempts.kind, 'password')));
    expect(rows.length).toBeGreaterThan(0);
    expect(new Set(rows.map((r) => r.ipAddress))).toEqual(new Set([peer]));
  });
});

describe('signing a review with a password', () => {
  it('shares the sign-in throttle: guesses at sign-in slow the signature too', async () => {
    const lab = await createOrganization();
    const reviewer = await createMember(lab.id, 'reviewer');
    // A review waiting for this reviewer (submitted by an analyst: four-eyes), so the signature
    // is what is checked.
    const analyst = await createMember(lab.id, 'analyst');
    const batchId = await insertBatch(lab.id, await insertCoating(lab.id, 'SG-1'), 'SG-L1');
    await insertDrop(lab.id, await insertSample(lab.id, batchId, 'S1'), { revisions: [{ meanDeg: 101 }] });
    const { reviewId } = await submitForReview(
      { organizationId: lab.id, userId: analyst.userId },
      { batchId, note: '' },
    );
    const guesser = `10.88.${randomBytes(1)[0]}.${randomBytes(1)[0]}`;
    await pastFailures(Array.from({ length: 6 }, () => ({ email: reviewer.email, ipAddress: guesser })), 1);
    const response = await decideReview(
      apiRequest(`/api/reviews/${reviewId}/decision`, {
        method: 'POST',
        sessionId: reviewer.sessionId,
        clientAddress: guesser,
        body: { decision: 'approve', password: TEST_PASSWORD },
      }),
      { params: Promise.resolve({ id: reviewId }) },
    );
    expect(response.status).toBe(403);
    const body = (await response.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('signature_failed');
    expect(body.error.message).toMatch(/Too many failed sign-in attempts/);
  });
});
