import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { memberships } from '@/db/schema';
import { closeMailQueue } from '@/server/mail/queue';
import {
  DELETE as deleteMember,
  PATCH as patchMember,
} from '@/app/api/team/members/[userId]/route';
import { changeRoleAction, removeMemberAction } from '@/app/(app)/team/actions';
import { ROLES, type Role } from '@/lib/auth/permissions';
import { apiRequest, simulateRequest } from '../support/request';
import { createMember, createOrganization } from '../support/fixtures';
import { auditRows, form } from './support';

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

type Member = Awaited<ReturnType<typeof createMember>>;

const patch = (actor: Member, userId: string, role: string) =>
  patchMember(
    apiRequest(`/api/team/members/${userId}`, {
      method: 'PATCH',
      sessionId: actor.sessionId,
      body: { role },
    }),
    {
      params: Promise.resolve({ userId }),
    },
  );
const remove = (actor: Member, userId: string) =>
  deleteMember(
    apiRequest(`/api/team/members/${userId}`, { method: 'DELETE', sessionId: actor.sessionId }),
    {
      params: Promise.resolve({ userId }),
    },
  );

async function roleOf(organizationId: string, userId: string): Promise<Role | null> {
  const [row] = await getDb()
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.organizationId, organizationId)));
  return row?.role ?? null;
}

/** The audit row of `action` on the member `userId` of the organization. */
async function memberAudit(organizationId: string, action: string, userId: string) {
  const [row] = await auditRows({ organizationId, action, entityId: userId });
  return row;
}

describe('role changes and removal', () => {
  let lab: { id: string };
  let admin: Member;
  let analyst: Member;

  beforeAll(async () => {
    lab = await createOrganization();
    admin = await createMember(lab.id, 'admin');
    analyst = await createMember(lab.id, 'analyst');
  });

  it('an admin changes a role; the change is audited with before and after', async () => {
    const response = await patch(admin, analyst.userId, 'reviewer');
    expect(response.status).toBe(200);
    expect((await response.json()).member).toEqual({ userId: analyst.userId, role: 'reviewer' });
    expect(await roleOf(lab.id, analyst.userId)).toBe('reviewer');
    expect(await memberAudit(lab.id, 'member.role_change', analyst.userId)).toMatchObject({
      actorUserId: admin.userId,
      before: { role: 'analyst' },
      after: { role: 'reviewer' },
    });
  });

  it('the last admin can neither be demoted nor removed, with a clear message and no audit row', async () => {
    const before = (await auditRows({ organizationId: lab.id })).length;
    const demote = await patch(admin, admin.userId, 'viewer');
    expect(demote.status).toBe(409);
    const body = await demote.json();
    expect(body.error.code).toBe('last_admin');
    expect(body.error.message).toMatch(/only admin .* Make another member an admin first/);
    const removal = await remove(admin, admin.userId);
    expect(removal.status).toBe(409);
    expect((await removal.json()).error.code).toBe('last_admin');
    expect(await roleOf(lab.id, admin.userId)).toBe('admin');
    expect(await auditRows({ organizationId: lab.id })).toHaveLength(before);
  });

  it('with a second admin, the first may step down', async () => {
    expect((await patch(admin, analyst.userId, 'admin')).status).toBe(200);
    expect((await patch(admin, admin.userId, 'analyst')).status).toBe(200);
    expect(await roleOf(lab.id, admin.userId)).toBe('analyst');
    // admin is now an analyst; the former analyst is the only admin.
    const lastAdmin = { ...analyst };
    const refused = await remove(lastAdmin, lastAdmin.userId);
    expect(refused.status).toBe(409);
  });

  it('an admin removes a member; audited; the member no longer belongs', async () => {
    const lab2 = await createOrganization();
    const boss = await createMember(lab2.id, 'admin');
    const leaving = await createMember(lab2.id, 'viewer');
    const response = await remove(boss, leaving.userId);
    expect(response.status).toBe(200);
    expect(await roleOf(lab2.id, leaving.userId)).toBeNull();
    expect(await memberAudit(lab2.id, 'member.remove', leaving.userId)).toMatchObject({
      actorUserId: boss.userId,
      before: { role: 'viewer', email: leaving.email },
    });
  });

  it('404 for someone who is not a member of this organization (also of another one)', async () => {
    const lab2 = await createOrganization();
    const boss = await createMember(lab2.id, 'admin');
    const elsewhere = await createMember((await createOrganization()).id, 'viewer');
    expect((await patch(boss, elsewhere.userId, 'admin')).status).toBe(404);
    expect((await remove(boss, elsewhere.userId)).status).toBe(404);
  });

  it('an invalid role names the field', async () => {
    const lab2 = await createOrganization();
    const boss = await createMember(lab2.id, 'admin');
    const response = await patch(boss, boss.userId, 'owner');
    expect(response.status).toBe(400);
    expect((await response.json()).error.fields.role).toMatch(/Choose a role/);
  });

  it('the Team page server actions do the same, with the last-admin message', async () => {
    const lab2 = await createOrganization();
    const boss = await createMember(lab2.id, 'admin');
    const other = await createMember(lab2.id, 'analyst');
    simulateRequest({ sessionId: boss.sessionId });
    expect(
      (await changeRoleAction({}, form({ userId: other.userId, role: 'viewer' }))).notice,
    ).toBe('Role saved.');
    expect(await roleOf(lab2.id, other.userId)).toBe('viewer');
    const refused = await changeRoleAction({}, form({ userId: boss.userId, role: 'viewer' }));
    expect(refused.code).toBe('last_admin');
    expect(refused.message).toMatch(/only admin/);
    expect((await removeMemberAction({}, form({ userId: other.userId }))).notice).toBe(
      'Member removed.',
    );
    expect(await roleOf(lab2.id, other.userId)).toBeNull();
  });

  for (const role of ROLES.filter((r) => r !== 'admin')) {
    it(`${role}: 403, nothing changes, no audit row`, async () => {
      const lab2 = await createOrganization();
      await createMember(lab2.id, 'admin');
      const actor = await createMember(lab2.id, role);
      const target = await createMember(lab2.id, 'viewer');
      const response = await patch(actor, target.userId, 'admin');
      expect(response.status).toBe(403);
      expect((await response.json()).error.code).toBe('forbidden');
      expect((await remove(actor, target.userId)).status).toBe(403);
      simulateRequest({ sessionId: actor.sessionId });
      expect(
        (await changeRoleAction({}, form({ userId: target.userId, role: 'admin' }))).code,
      ).toBe('forbidden');
      expect((await removeMemberAction({}, form({ userId: target.userId }))).code).toBe(
        'forbidden',
      );
      expect(await roleOf(lab2.id, target.userId)).toBe('viewer');
      const rows = await auditRows({ organizationId: lab2.id });
      expect(rows.filter((r) => r.action.startsWith('member.'))).toHaveLength(0);
    });
  }

  it('refuses a foreign Origin', async () => {
    const response = await patchMember(
      apiRequest(`/api/team/members/${analyst.userId}`, {
        method: 'PATCH',
        sessionId: admin.sessionId,
        origin: 'http://evil.example',
        body: { role: 'viewer' },
      }),
      { params: Promise.resolve({ userId: analyst.userId }) },
    );
    expect(response.status).toBe(403);
    expect((await response.json()).error.code).toBe('bad_origin');
  });
});
