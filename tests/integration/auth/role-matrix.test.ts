import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import { renameOrganization, switchOrganization } from '@/app/(app)/actions';
import { GET as getMe } from '@/app/api/me/route';
import { GET as getMembers } from '@/app/api/team/members/route';
import { PATCH as patchOrganization } from '@/app/api/organization/route';
import { ACTIONS, ROLES, type Role } from '@/lib/auth/permissions';
import { apiRequest, simulateRequest } from '../support/request';
import {
  createMember,
  expireSession,
  labWithEveryRole,
  organizationName,
  type Member,
} from '../support/fixtures';

const BASE_URL = process.env.E2E_BASE_URL;

let lab: { id: string; name: string };
let otherLab: { id: string; name: string };
let members: Record<Role, Member>;
let outsider: Member;

beforeAll(async () => {
  ({ lab, otherLab, members, outsider } = await labWithEveryRole());
});

afterAll(async () => {
  await closeDb();
});

const manageTeam = (ACTIONS['team:manage'] as readonly Role[]).includes.bind(ACTIONS['team:manage']);

describe('route handler GET /api/team/members (team:manage)', () => {
  it('answers 401 when signed out', async () => {
    const response = await getMembers(apiRequest('/api/team/members'), {});
    expect(response.status).toBe(401);
    const body = await response.json();
    expect(body.error.code).toBe('unauthorized');
    expect(body.error.message).toMatch(/sign in/i);
  });

  for (const role of ROLES) {
    const allowed = manageTeam(role);
    it(`${role}: ${allowed ? '200 with the members' : '403'}`, async () => {
      const response = await getMembers(
        apiRequest('/api/team/members', { sessionId: members[role].sessionId }),
        {},
      );
      expect(response.status).toBe(allowed ? 200 : 403);
      const body = await response.json();
      if (allowed) {
        const emails = body.members.map((m: { email: string }) => m.email).sort();
        expect(emails).toEqual(ROLES.map((r) => members[r].email).sort());
      } else {
        expect(body.error.code).toBe('forbidden');
      }
    });
  }

  it('an admin of another organization sees only their own members', async () => {
    const response = await getMembers(apiRequest('/api/team/members', { sessionId: outsider.sessionId }), {});
    const body = await response.json();
    expect(body.members.map((m: { email: string }) => m.email)).toEqual([outsider.email]);
  });

  it('refuses an expired session with 401', async () => {
    const shortLived = await createMember(lab.id, 'admin');
    await expireSession(shortLived.sessionId);
    const response = await getMembers(apiRequest('/api/team/members', { sessionId: shortLived.sessionId }), {});
    expect(response.status).toBe(401);
  });
});

describe('route handler GET /api/me (organization:read)', () => {
  for (const role of ROLES) {
    it(`${role}: 200 with the role in this organization`, async () => {
      const response = await getMe(apiRequest('/api/me', { sessionId: members[role].sessionId }), {});
      expect(response.status).toBe(200);
      const body = await response.json();
      expect(body.organization).toEqual({ id: lab.id, name: expect.any(String), role });
    });
  }
});

describe('route handler PATCH /api/organization (mutation)', () => {
  it('refuses a request from another origin before anything else', async () => {
    const response = await patchOrganization(
      apiRequest('/api/organization', {
        method: 'PATCH',
        sessionId: members.admin.sessionId,
        origin: 'http://evil.example',
        body: { name: 'Hijacked' },
      }),
      {},
    );
    expect(response.status).toBe(403);
    expect((await response.json()).error.code).toBe('bad_origin');
    expect(await organizationName(lab.id)).not.toBe('Hijacked');
  });

  it('names the invalid field', async () => {
    const response = await patchOrganization(
      apiRequest('/api/organization', { method: 'PATCH', sessionId: members.admin.sessionId, body: { name: 'x' } }),
      {},
    );
    expect(response.status).toBe(400);
    const body = await response.json();
    expect(body.error.code).toBe('invalid_input');
    expect(body.error.fields.name).toMatch(/at least 2/);
  });

  it('analyst gets 403, admin renames', async () => {
    const denied = await patchOrganization(
      apiRequest('/api/organization', { method: 'PATCH', sessionId: members.analyst.sessionId, body: { name: 'Analyst lab' } }),
      {},
    );
    expect(denied.status).toBe(403);
    const ok = await patchOrganization(
      apiRequest('/api/organization', { method: 'PATCH', sessionId: members.admin.sessionId, body: { name: 'Renamed lab' } }),
      {},
    );
    expect(ok.status).toBe(200);
    expect(await organizationName(lab.id)).toBe('Renamed lab');
  });
});

describe('server action renameOrganization (team:manage)', () => {
  const form = (name: string) => {
    const data = new FormData();
    data.set('name', name);
    return data;
  };

  it('signed out: unauthorized', async () => {
    simulateRequest({ sessionId: null });
    const result = await renameOrganization(null, form('Nobody'));
    expect(result).toMatchObject({ ok: false, error: { code: 'unauthorized' } });
  });

  for (const role of ROLES) {
    const allowed = manageTeam(role);
    it(`${role}: ${allowed ? 'renames' : 'forbidden, nothing changes'}`, async () => {
      const before = await organizationName(lab.id);
      simulateRequest({ sessionId: members[role].sessionId });
      const result = await renameOrganization(null, form(`Lab by ${role}`));
      if (allowed) {
        expect(result.ok).toBe(true);
        expect(await organizationName(lab.id)).toBe(`Lab by ${role}`);
      } else {
        expect(result).toMatchObject({ ok: false, error: { code: 'forbidden' } });
        expect(await organizationName(lab.id)).toBe(before);
      }
    });
  }

  it('an admin of another organization renames only their own', async () => {
    const before = await organizationName(lab.id);
    simulateRequest({ sessionId: outsider.sessionId });
    const result = await renameOrganization(null, form('Outsider lab'));
    expect(result.ok).toBe(true);
    expect(await organizationName(otherLab.id)).toBe('Outsider lab');
    expect(await organizationName(lab.id)).toBe(before);
  });

  it('refuses a foreign origin', async () => {
    simulateRequest({ sessionId: members.admin.sessionId, origin: 'http://evil.example' });
    const result = await renameOrganization(null, form('Evil'));
    expect(result).toMatchObject({ ok: false, error: { code: 'bad_origin' } });
  });
});

describe('server action switchOrganization', () => {
  it('refuses to switch into an organization the user does not belong to', async () => {
    simulateRequest({ sessionId: outsider.sessionId });
    const data = new FormData();
    data.set('organizationId', lab.id);
    const result = await switchOrganization(data);
    expect(result).toMatchObject({ ok: false, error: { code: 'forbidden' } });
    const me = await getMe(apiRequest('/api/me', { sessionId: outsider.sessionId }), {});
    expect((await me.json()).organization.id).toBe(otherLab.id);
  });
});

describe.skipIf(!BASE_URL)('protected page /team on the running server', () => {
  it('signed out: redirected to the sign-in page', async () => {
    const response = await fetch(`${BASE_URL}/team`, { redirect: 'manual' });
    expect([303, 307, 308]).toContain(response.status);
    expect(response.headers.get('location')).toMatch(/\/sign-in/);
  });

  for (const role of ROLES) {
    const allowed = manageTeam(role);
    it(`${role}: ${allowed ? '200' : '403'}`, async () => {
      const response = await fetch(`${BASE_URL}/team`, {
        redirect: 'manual',
        headers: { cookie: `beadline_session=${members[role].sessionId}` },
      });
      expect(response.status).toBe(allowed ? 200 : 403);
      const html = await response.text();
      if (allowed) expect(html).toContain(members.viewer.email);
      else expect(html).not.toContain(members.viewer.email);
    });
  }

  it('an admin of another organization does not see this organization’s members', async () => {
    const response = await fetch(`${BASE_URL}/team`, {
      headers: { cookie: `beadline_session=${outsider.sessionId}` },
    });
    expect(response.status).toBe(200);
    expect(await response.text()).not.toContain(members.admin.email);
  });
});
