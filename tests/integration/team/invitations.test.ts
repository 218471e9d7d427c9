import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { invitations, memberships, users } from '@/db/schema';
import { closeMailQueue } from '@/server/mail/queue';
import { hashToken } from '@/lib/auth/tokens';
import { GET as listInvitations, POST as postInvitation } from '@/app/api/invitations/route';
import { DELETE as deleteInvitation } from '@/app/api/invitations/[id]/route';
import {
  acceptInvitationAsMember,
  acceptInvitationWithNewAccount,
} from '@/app/(auth)/account-actions';
import { inviteMember } from '@/app/(app)/team/actions';
import { ROLES } from '@/lib/auth/permissions';
import { apiRequest, simulateRequest } from '../support/request';
import { createMember, createOrganization, uniqueEmail } from '../support/fixtures';
import { checkCredentials } from '@/lib/auth/sign-in';
import { auditRows, form, mailJobsTo, redirectOf, tokenIn } from './support';

let lab: { id: string; name: string };
let admin: Awaited<ReturnType<typeof createMember>>;

beforeAll(async () => {
  lab = await createOrganization();
  admin = await createMember(lab.id, 'admin');
});

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

async function invite(email: string, role: string, sessionId = admin.sessionId) {
  return postInvitation(
    apiRequest('/api/invitations', { method: 'POST', sessionId, body: { email, role } }),
    {},
  );
}

async function invitationRow(id: string) {
  const [row] = await getDb().select().from(invitations).where(eq(invitations.id, id));
  return row!;
}

describe('invitation lifecycle', () => {
  it('creates the invitation, queues its mail and audits it; the token is stored only as SHA-256', async () => {
    const email = uniqueEmail('invitee');
    const response = await invite(email.toUpperCase(), 'reviewer');
    expect(response.status).toBe(201);
    const { invitation } = await response.json();
    expect(invitation).toMatchObject({ email, role: 'reviewer' });
    const expiresIn = new Date(invitation.expiresAt).getTime() - Date.now();
    expect(expiresIn).toBeGreaterThan(7 * 24 * 3600_000 - 60_000);
    expect(expiresIn).toBeLessThanOrEqual(7 * 24 * 3600_000);

    const jobs = await mailJobsTo(email);
    expect(jobs).toHaveLength(1);
    expect(jobs[0]!.data.kind).toBe('invitation');
    expect(jobs[0]!.data.subject).toBe(`Join ${lab.name} on Beadline`);
    expect(jobs[0]!.data.html).toContain('/invitations/accept?token=');
    const token = tokenIn(jobs[0]!.data.text);
    expect(Buffer.from(token, 'base64url')).toHaveLength(32);
    const row = await invitationRow(invitation.id);
    expect(row.tokenHash).toBe(hashToken(token));
    expect(row.tokenHash).not.toContain(token);

    const audit = await auditRows({ action: 'invitation.create', entityId: invitation.id });
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ actorUserId: admin.userId, organizationId: lab.id });

    const list = await (
      await listInvitations(apiRequest('/api/invitations', { sessionId: admin.sessionId }), {})
    ).json();
    expect(list.invitations.map((i: { email: string }) => i.email)).toContain(email);
  });

  it('accepting as a new person creates the account and the membership with the invited role, once', async () => {
    const email = uniqueEmail('newcomer');
    const { invitation } = await (await invite(email, 'analyst')).json();
    const token = tokenIn((await mailJobsTo(email))[0]!.data.text);

    simulateRequest({ sessionId: null });
    const where = await redirectOf(
      acceptInvitationWithNewAccount(
        {},
        form({ token, name: 'Noor Testfield', password: 'a long new password' }),
      ),
    );
    expect(where).toBe('/dashboard');
    const [user] = await getDb().select().from(users).where(eq(users.email, email));
    expect(user).toMatchObject({ name: 'Noor Testfield' });
    expect(user!.emailVerifiedAt).not.toBeNull();
    const [membership] = await getDb()
      .select()
      .from(memberships)
      .where(and(eq(memberships.userId, user!.id), eq(memberships.organizationId, lab.id)));
    expect(membership?.role).toBe('analyst');
    expect((await invitationRow(invitation.id)).acceptedAt).not.toBeNull();
    expect(
      await checkCredentials({ email, password: 'a long new password', ipAddress: '10.1.1.1' }),
    ).toMatchObject({ ok: true });
    expect(await auditRows({ action: 'invitation.accept', entityId: invitation.id })).toHaveLength(
      1,
    );

    // Single use: the same link again is refused and changes nothing.
    simulateRequest({ sessionId: null });
    const again = await acceptInvitationWithNewAccount(
      {},
      form({ token, name: 'Someone Else', password: 'another long password' }),
    );
    expect(again).toMatchObject({ code: 'invitation_used' });
    expect(again.message).toMatch(/already used/);
    expect(again.values?.name).toBe('Someone Else');
    expect(await auditRows({ action: 'invitation.accept', entityId: invitation.id })).toHaveLength(
      1,
    );
  });

  it('an existing user signed in with the invited e-mail gets the membership', async () => {
    const otherLab = await createOrganization();
    const person = await createMember(otherLab.id, 'viewer');
    const { invitation } = await (await invite(person.email, 'reviewer')).json();
    const token = tokenIn((await mailJobsTo(person.email))[0]!.data.text);
    simulateRequest({ sessionId: person.sessionId });
    expect(await redirectOf(acceptInvitationAsMember({}, form({ token })))).toBe('/dashboard');
    const [membership] = await getDb()
      .select()
      .from(memberships)
      .where(and(eq(memberships.userId, person.userId), eq(memberships.organizationId, lab.id)));
    expect(membership?.role).toBe('reviewer');
    expect(await auditRows({ action: 'invitation.accept', entityId: invitation.id })).toHaveLength(
      1,
    );
  });

  it('refuses a signed-in user whose e-mail is not the invited one, and leaves no trace', async () => {
    const email = uniqueEmail('intended');
    const { invitation } = await (await invite(email, 'viewer')).json();
    const token = tokenIn((await mailJobsTo(email))[0]!.data.text);
    const stranger = await createMember((await createOrganization()).id, 'admin');
    simulateRequest({ sessionId: stranger.sessionId });
    const result = await acceptInvitationAsMember({}, form({ token }));
    expect(result).toMatchObject({ code: 'wrong_email' });
    expect(result.message).toContain(email);
    expect((await invitationRow(invitation.id)).acceptedAt).toBeNull();
    expect(await auditRows({ action: 'invitation.accept', entityId: invitation.id })).toHaveLength(
      0,
    );
  });

  it('refuses an expired invitation', async () => {
    const email = uniqueEmail('late');
    const { invitation } = await (await invite(email, 'viewer')).json();
    const token = tokenIn((await mailJobsTo(email))[0]!.data.text);
    await getDb()
      .update(invitations)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(invitations.id, invitation.id));
    simulateRequest({ sessionId: null });
    const result = await acceptInvitationWithNewAccount(
      {},
      form({ token, name: 'Late Person', password: 'a long new password' }),
    );
    expect(result).toMatchObject({ code: 'invitation_expired' });
    expect(result.message).toMatch(/expired/);
    expect(await getDb().select().from(users).where(eq(users.email, email))).toHaveLength(0);
    expect(await auditRows({ action: 'invitation.accept', entityId: invitation.id })).toHaveLength(
      0,
    );
  });

  it('a revoked invitation cannot be accepted; revoking is audited, revoking twice is refused', async () => {
    const email = uniqueEmail('revoked');
    const { invitation } = await (await invite(email, 'analyst')).json();
    const token = tokenIn((await mailJobsTo(email))[0]!.data.text);
    const revoke = () =>
      deleteInvitation(
        apiRequest(`/api/invitations/${invitation.id}`, {
          method: 'DELETE',
          sessionId: admin.sessionId,
        }),
        {
          params: Promise.resolve({ id: invitation.id }),
        },
      );
    expect((await revoke()).status).toBe(200);
    expect(await auditRows({ action: 'invitation.revoke', entityId: invitation.id })).toHaveLength(
      1,
    );
    const second = await revoke();
    expect(second.status).toBe(409);
    expect(await auditRows({ action: 'invitation.revoke', entityId: invitation.id })).toHaveLength(
      1,
    );
    simulateRequest({ sessionId: null });
    const result = await acceptInvitationWithNewAccount(
      {},
      form({ token, name: 'Too Late', password: 'a long new password' }),
    );
    expect(result).toMatchObject({ code: 'invitation_revoked' });
  });

  it('refuses an unknown token', async () => {
    simulateRequest({ sessionId: null });
    const result = await acceptInvitationWithNewAccount(
      {},
      form({ token: 'not-a-real-token', name: 'X', password: 'a long new password' }),
    );
    expect(result).toMatchObject({ code: 'invitation_not_found' });
  });

  it('refuses to invite a member or someone already invited, naming the field', async () => {
    const member = await invite(admin.email, 'viewer');
    expect(member.status).toBe(409);
    expect((await member.json()).error).toMatchObject({
      code: 'already_member',
      fields: { email: expect.any(String) },
    });
    const email = uniqueEmail('twice');
    expect((await invite(email, 'viewer')).status).toBe(201);
    const twice = await invite(email, 'viewer');
    expect(twice.status).toBe(409);
    expect((await twice.json()).error.code).toBe('already_invited');
    expect(await mailJobsTo(email)).toHaveLength(1);
  });

  it('validates the body: a clear message per field', async () => {
    const response = await invite('not-an-email', 'overlord');
    expect(response.status).toBe(400);
    const body = await response.json();
    expect(body.error.fields.email).toMatch(/valid e-mail/);
    expect(body.error.fields.role).toMatch(/Choose a role/);
  });

  it('refuses a foreign Origin before anything else', async () => {
    const email = uniqueEmail('csrf');
    const response = await postInvitation(
      apiRequest('/api/invitations', {
        method: 'POST',
        sessionId: admin.sessionId,
        origin: 'http://evil.example',
        body: { email, role: 'admin' },
      }),
      {},
    );
    expect(response.status).toBe(403);
    expect((await response.json()).error.code).toBe('bad_origin');
    expect(await mailJobsTo(email)).toHaveLength(0);
  });

  for (const role of ROLES.filter((r) => r !== 'admin')) {
    it(`${role}: 403 on every invitation route and the server action, nothing queued`, async () => {
      const member = await createMember(lab.id, role);
      const email = uniqueEmail(`by-${role}`);
      const post = await invite(email, 'admin', member.sessionId);
      expect(post.status).toBe(403);
      expect((await post.json()).error.code).toBe('forbidden');
      const get = await listInvitations(
        apiRequest('/api/invitations', { sessionId: member.sessionId }),
        {},
      );
      expect(get.status).toBe(403);
      const del = await deleteInvitation(
        apiRequest('/api/invitations/x', { method: 'DELETE', sessionId: member.sessionId }),
        { params: Promise.resolve({ id: 'x' }) },
      );
      expect(del.status).toBe(403);
      simulateRequest({ sessionId: member.sessionId });
      const action = await inviteMember({}, form({ email, role: 'admin' }));
      expect(action.code).toBe('forbidden');
      expect(action.values?.email).toBe(email);
      expect(await mailJobsTo(email)).toHaveLength(0);
    });
  }

  it('the Team page form (server action) invites and reports what happened', async () => {
    const email = uniqueEmail('by-form');
    simulateRequest({ sessionId: admin.sessionId });
    const ok = await inviteMember({}, form({ email, role: 'viewer' }));
    expect(ok.notice).toMatch(/Invitation sent to/);
    expect(await mailJobsTo(email)).toHaveLength(1);
    const bad = await inviteMember({}, form({ email: 'typo@', role: 'viewer' }));
    expect(bad.fields?.email).toMatch(/valid e-mail/);
    expect(bad.values?.email).toBe('typo@');
  });
});
