import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { emailVerificationTokens, passwordResetTokens, sessions, users } from '@/db/schema';
import { closeMailQueue } from '@/server/mail/queue';
import { hashToken } from '@/lib/auth/tokens';
import { checkCredentials } from '@/lib/auth/sign-in';
import {
  requestPasswordResetAction,
  resetPasswordAction,
  verifyEmailAction,
} from '@/app/(auth)/account-actions';
import { resendVerificationAction } from '@/app/(app)/account-actions';
import { simulateRequest } from '../support/request';
import { createMember, createOrganization, TEST_PASSWORD, uniqueEmail } from '../support/fixtures';
import { auditRows, form, mailJobsTo, redirectOf, tokenIn } from './support';

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

const NEW_PASSWORD = 'a fresh password 2026';
const address = () => `10.77.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`;

async function requestReset(email: string) {
  simulateRequest({ sessionId: null });
  return requestPasswordResetAction({}, form({ email }));
}

describe('password reset', () => {
  let lab: { id: string };
  let member: Awaited<ReturnType<typeof createMember>>;

  beforeAll(async () => {
    lab = await createOrganization();
    member = await createMember(lab.id, 'analyst');
  });

  it('answers the same whether or not the address has an account; only a real account gets a mail', async () => {
    const known = await requestReset(member.email);
    const unknownEmail = uniqueEmail('nobody');
    const unknown = await requestReset(unknownEmail);
    const strip = (s: typeof known) => ({
      ...s,
      notice: s.notice?.replace(/\S+@\S+/, '<email>'),
      values: undefined,
    });
    expect(strip(known)).toEqual(strip(unknown));
    expect(known.notice).toMatch(/If .* has a Beadline account/);
    expect(await mailJobsTo(unknownEmail)).toHaveLength(0);
    const jobs = await mailJobsTo(member.email);
    expect(jobs).toHaveLength(1);
    expect(jobs[0]!.data.kind).toBe('password-reset');
    const token = tokenIn(jobs[0]!.data.text);
    const [row] = await getDb()
      .select()
      .from(passwordResetTokens)
      .where(eq(passwordResetTokens.tokenHash, hashToken(token)));
    expect(row).toBeTruthy();
    const lifetime = row!.expiresAt.getTime() - row!.createdAt.getTime();
    expect(Math.abs(lifetime - 3600_000)).toBeLessThan(5_000);
  });

  it('sets the new password, ends every session, audits it, and the link works once', async () => {
    const second = await createMember(lab.id, 'viewer');
    const token = tokenIn((await mailJobsTo(member.email)).at(-1)!.data.text);
    // A second session of the same user.
    const [firstSession] = await getDb()
      .select()
      .from(sessions)
      .where(eq(sessions.userId, member.userId));
    expect(firstSession).toBeTruthy();

    simulateRequest({ sessionId: null });
    expect(await redirectOf(resetPasswordAction({}, form({ token, password: NEW_PASSWORD })))).toBe(
      '/sign-in?reason=password-reset',
    );
    expect(
      await getDb().select().from(sessions).where(eq(sessions.userId, member.userId)),
    ).toHaveLength(0);
    // Someone else's session is untouched.
    expect(
      await getDb().select().from(sessions).where(eq(sessions.userId, second.userId)),
    ).toHaveLength(1);
    expect(
      await checkCredentials({ email: member.email, password: NEW_PASSWORD, ipAddress: address() }),
    ).toMatchObject({ ok: true });
    expect(
      await checkCredentials({
        email: member.email,
        password: TEST_PASSWORD,
        ipAddress: address(),
      }),
    ).toMatchObject({ ok: false });
    const audit = await auditRows({ action: 'auth.password_reset', entityId: member.userId });
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({
      organizationId: lab.id,
      actorUserId: member.userId,
      after: { sessionsEnded: 1 },
    });

    const again = await resetPasswordAction({}, form({ token, password: 'yet another password' }));
    expect(again).toMatchObject({ code: 'token_used' });
    expect(again.message).toMatch(/already used/);
    expect(
      await auditRows({ action: 'auth.password_reset', entityId: member.userId }),
    ).toHaveLength(1);
  });

  it('refuses a link older than one hour, and leaves the password and the sessions alone', async () => {
    const lab2 = await createOrganization();
    const person = await createMember(lab2.id, 'viewer');
    await requestReset(person.email);
    const token = tokenIn((await mailJobsTo(person.email))[0]!.data.text);
    await getDb()
      .update(passwordResetTokens)
      .set({ expiresAt: new Date(Date.now() - 1) })
      .where(eq(passwordResetTokens.tokenHash, hashToken(token)));
    simulateRequest({ sessionId: null });
    const result = await resetPasswordAction({}, form({ token, password: NEW_PASSWORD }));
    expect(result).toMatchObject({ code: 'token_expired' });
    expect(result.message).toMatch(/one hour/);
    expect(
      await getDb().select().from(sessions).where(eq(sessions.userId, person.userId)),
    ).toHaveLength(1);
    expect(
      await checkCredentials({
        email: person.email,
        password: TEST_PASSWORD,
        ipAddress: address(),
      }),
    ).toMatchObject({ ok: true });
    expect(
      await auditRows({ action: 'auth.password_reset', entityId: person.userId }),
    ).toHaveLength(0);
  });

  it('applies the sign-up password rules', async () => {
    const lab2 = await createOrganization();
    const person = await createMember(lab2.id, 'viewer');
    await requestReset(person.email);
    const token = tokenIn((await mailJobsTo(person.email))[0]!.data.text);
    simulateRequest({ sessionId: null });
    const result = await resetPasswordAction({}, form({ token, password: 'short' }));
    expect(result.fields?.password).toMatch(/at least 10 characters/);
  });

  it('refuses an unknown token', async () => {
    simulateRequest({ sessionId: null });
    const result = await resetPasswordAction(
      {},
      form({ token: 'made-up', password: NEW_PASSWORD }),
    );
    expect(result).toMatchObject({ code: 'token_not_found' });
  });
});

describe('e-mail verification', () => {
  // A finished sign-up proves its address (tests/integration/auth/sign-up.test.ts); accounts
  // without a proven address (older ones, and members created here) confirm it with this link.
  it('the dashboard banner queues a confirmation mail; the link confirms the address once; resend waits a minute', async () => {
    const lab = await createOrganization();
    const member = await createMember(lab.id, 'analyst');
    const [user] = await getDb().select().from(users).where(eq(users.id, member.userId));
    expect(user!.emailVerifiedAt).toBeNull();
    simulateRequest({ sessionId: member.sessionId });
    expect((await resendVerificationAction({}, new FormData())).notice).toMatch(/Sent/);
    const jobs = await mailJobsTo(member.email);
    expect(jobs).toHaveLength(1);
    expect(jobs[0]!.data.kind).toBe('email-verification');
    const token = tokenIn(jobs[0]!.data.text);

    // A resend within a minute is refused politely.
    simulateRequest({ sessionId: member.sessionId });
    const soon = await resendVerificationAction({}, new FormData());
    expect(soon.code).toBe('too_soon');
    expect(await mailJobsTo(member.email)).toHaveLength(1);

    simulateRequest({ sessionId: null });
    const ok = await verifyEmailAction({}, form({ token }));
    expect(ok.notice).toMatch(/is confirmed/);
    const [after] = await getDb().select().from(users).where(eq(users.id, member.userId));
    expect(after!.emailVerifiedAt).not.toBeNull();
    expect(await verifyEmailAction({}, form({ token }))).toMatchObject({ code: 'token_used' });

    simulateRequest({ sessionId: member.sessionId });
    expect((await resendVerificationAction({}, new FormData())).notice).toMatch(
      /already confirmed/,
    );
  });

  it('refuses an expired link', async () => {
    const lab = await createOrganization();
    const member = await createMember(lab.id, 'viewer');
    simulateRequest({ sessionId: member.sessionId });
    await resendVerificationAction({}, new FormData());
    const token = tokenIn((await mailJobsTo(member.email))[0]!.data.text);
    await getDb()
      .update(emailVerificationTokens)
      .set({ expiresAt: new Date(Date.now() - 1) })
      .where(eq(emailVerificationTokens.tokenHash, hashToken(token)));
    simulateRequest({ sessionId: null });
    expect(await verifyEmailAction({}, form({ token }))).toMatchObject({ code: 'token_expired' });
    const [user] = await getDb().select().from(users).where(eq(users.id, member.userId));
    expect(user!.emailVerifiedAt).toBeNull();
  });
});
