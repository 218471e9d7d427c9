import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { memberships, pendingSignUps, users } from '@/db/schema';
import { closeMailQueue } from '@/server/mail/queue';
import { finishSignUpAction, signUp } from '@/app/(auth)/actions';
import { checkCredentials, SIGN_UP_LIMITS } from '@/lib/auth/sign-in';
import { hashToken } from '@/lib/auth/tokens';
import { requestState, simulateRequest } from '../support/request';
import { createMember, createOrganization, TEST_PASSWORD, uniqueEmail } from '../support/fixtures';
import { form, mailJobsTo, redirectOf, tokenIn } from '../team/support';

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

const someAddress = () => `10.55.${randomBytes(1)[0]}.${randomBytes(1)[0]}`;

function signUpForm(email: string, password = 'a long enough password') {
  return form({ name: 'Ida Newlab', email, password, organizationName: 'Newlab Coatings' });
}

async function submit(email: string, clientAddress = someAddress(), password?: string) {
  simulateRequest({ sessionId: null, clientAddress });
  return signUp({}, signUpForm(email, password));
}

describe('sign-up', () => {
  it('answers the same for a new address and for one that has an account', async () => {
    const lab = await createOrganization();
    const holder = await createMember(lab.id, 'analyst');
    const fresh = uniqueEmail('fresh');
    const forNew = await submit(fresh);
    const forExisting = await submit(holder.email);
    const general = (state: typeof forNew) => ({ ...state, notice: state.notice?.replace(/\S+@\S+/, '<email>') });
    expect(general(forNew)).toEqual(general(forExisting));
    expect(forNew.notice).toMatch(/Check your mail/);
    expect(forExisting.fields).toBeUndefined();
    expect(forExisting.message).toBeUndefined();

    // The holder is told by mail instead, and nothing about the account changed.
    const note = await mailJobsTo(holder.email);
    expect(note).toHaveLength(1);
    expect(note[0]!.data.kind).toBe('sign-up-existing-account');
    expect(note[0]!.data.text).toMatch(/already has one/);
    expect(await getDb().select().from(pendingSignUps).where(eq(pendingSignUps.email, holder.email))).toHaveLength(0);
    expect((await checkCredentials({ email: holder.email, password: TEST_PASSWORD, ipAddress: someAddress() })).ok).toBe(true);
  });

  it('creates nothing until the mailed link is followed; then the account, the lab and the session, once', async () => {
    const email = uniqueEmail('newlab');
    expect((await submit(email)).notice).toMatch(/Check your mail/);
    expect(await getDb().select().from(users).where(eq(users.email, email))).toHaveLength(0);
    const [mail] = await mailJobsTo(email);
    expect(mail!.data.kind).toBe('sign-up');
    expect(mail!.data.text).toMatch(/\/sign-up\/finish\?token=/);
    const token = tokenIn(mail!.data.text);

    simulateRequest({ sessionId: null });
    expect(await redirectOf(finishSignUpAction({}, form({ token })))).toBe('/dashboard');
    expect(requestState.cookies.get('beadline_session')).toBeTruthy();
    const [user] = await getDb().select().from(users).where(eq(users.email, email));
    expect(user).toMatchObject({ name: 'Ida Newlab' });
    expect(user!.emailVerifiedAt).not.toBeNull();
    const [membership] = await getDb().select().from(memberships).where(eq(memberships.userId, user!.id));
    expect(membership?.role).toBe('admin');
    expect((await checkCredentials({ email, password: 'a long enough password', ipAddress: someAddress() })).ok).toBe(true);

    simulateRequest({ sessionId: null });
    expect(await finishSignUpAction({}, form({ token }))).toMatchObject({ code: 'token_used' });
    expect(await finishSignUpAction({}, form({ token: 'made-up' }))).toMatchObject({ code: 'token_not_found' });
  });

  it('refuses an expired link and creates nothing', async () => {
    const email = uniqueEmail('late');
    await submit(email);
    const token = tokenIn((await mailJobsTo(email))[0]!.data.text);
    await getDb()
      .update(pendingSignUps)
      .set({ expiresAt: new Date(Date.now() - 1) })
      .where(eq(pendingSignUps.tokenHash, hashToken(token)));
    simulateRequest({ sessionId: null });
    expect(await finishSignUpAction({}, form({ token }))).toMatchObject({ code: 'token_expired' });
    expect(await getDb().select().from(users).where(eq(users.email, email))).toHaveLength(0);
  });

  it('keeps the form rules: an invalid form names each field and sends nothing', async () => {
    const email = uniqueEmail('short');
    const state = await submit(email, someAddress(), 'short');
    expect(state.fields?.password).toMatch(/at least 10 characters/);
    expect(await mailJobsTo(email)).toHaveLength(0);
  });

  it('is throttled per network address', async () => {
    const address = someAddress();
    for (let i = 0; i < SIGN_UP_LIMITS.perAddress; i++) {
      expect((await submit(uniqueEmail('burst'), address)).notice).toMatch(/Check your mail/);
    }
    const refused = await submit(uniqueEmail('burst'), address);
    expect(refused).toMatchObject({ code: 'too_many_attempts' });
    expect(refused.message).toMatch(/Wait \d+ minutes?/);
    expect((await submit(uniqueEmail('elsewhere'))).notice).toMatch(/Check your mail/);
  });
});
