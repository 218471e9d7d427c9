/**
 * Who may do what with the lab records, per the one table in lib/auth/permissions.ts: every
 * role reads; catalog (coatings, specs, probe liquids) is for admins; batches, samples and
 * measurement sessions for admins and analysts. Another organization's records answer 404.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import { ACTIONS, ROLES, type Action, type Role } from '@/lib/auth/permissions';
import {
  api,
  auditOf,
  auditSince,
  bodies,
  createLab,
  ensureLibrary,
  lastAuditId,
  resources,
  type Lab,
  type Resource,
} from './helpers';

let lab: Lab;
let otherLab: Lab;
/** Records made by each lab's admin in beforeAll, per resource. */
const base = {} as Record<keyof typeof resources, string>;
const foreign = {} as Record<keyof typeof resources, string>;

async function made(resource: Resource, sessionId: string, body: unknown): Promise<string> {
  const response = await api.create(resource, { sessionId, body });
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body[resource.key].id;
}

async function seedRecords(target: Lab, into: Record<keyof typeof resources, string>) {
  const admin = target.members.admin.sessionId;
  into.coatings = await made(resources.coatings, admin, bodies.coating());
  into.specs = await made(resources.specs, admin, bodies.spec(into.coatings));
  into.batches = await made(resources.batches, admin, bodies.batch(into.coatings));
  into.samples = await made(resources.samples, admin, bodies.sample(into.batches));
  into.probeLiquids = await made(resources.probeLiquids, admin, bodies.probeLiquid());
  into.measurementSessions = await made(
    resources.measurementSessions,
    admin,
    bodies.measurementSession(),
  );
}

beforeAll(async () => {
  await ensureLibrary();
  lab = await createLab();
  otherLab = await createLab();
  await seedRecords(lab, base);
  await seedRecords(otherLab, foreign);
});

afterAll(async () => {
  await closeDb();
});

type Case = {
  name: keyof typeof resources;
  write: Action;
  body: () => unknown;
  change: Record<string, unknown>;
};

const cases: Case[] = [
  {
    name: 'coatings',
    write: 'catalog:manage',
    body: () => bodies.coating(),
    change: { name: 'Renamed topcoat' },
  },
  {
    name: 'specs',
    write: 'catalog:manage',
    body: () => bodies.spec(base.coatings),
    change: { minDeg: 95 },
  },
  {
    name: 'probeLiquids',
    write: 'catalog:manage',
    body: () => bodies.probeLiquid(),
    change: { hazardNote: 'Keep capped' },
  },
  {
    name: 'batches',
    write: 'records:write',
    body: () => bodies.batch(base.coatings),
    change: { notes: 'Re-cured' },
  },
  {
    name: 'samples',
    write: 'records:write',
    body: () => bodies.sample(base.batches),
    change: { position: 'centre' },
  },
  {
    name: 'measurementSessions',
    write: 'records:write',
    body: () => bodies.measurementSession(),
    change: { humidityPct: 50 },
  },
];

const allowedTo = (action: Action, role: Role) =>
  (ACTIONS[action] as readonly Role[]).includes(role);

describe.each(cases)('$name', ({ name, write, body, change }) => {
  const resource: Resource = resources[name];

  it('signed out: 401 on list and create', async () => {
    expect((await api.list(resource, { sessionId: '' })).status).toBe(401);
    expect((await api.create(resource, { sessionId: '', body: body() })).status).toBe(401);
  });

  it('refuses a mutation from another origin (403 bad_origin), nothing written', async () => {
    const mark = await lastAuditId();
    const response = await api.create(resource, {
      sessionId: lab.members.admin.sessionId,
      body: body(),
      origin: 'http://elsewhere.example',
    });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('bad_origin');
    expect(await auditSince(lab.id, mark)).toEqual([]);
  });

  describe.each(ROLES)('%s', (role) => {
    const allowed = allowedTo(write, role);
    const session = () => lab.members[role].sessionId;

    it('lists and reads the organization’s records (200)', async () => {
      const list = await api.list(resource, { sessionId: session(), query: 'pageSize=200' });
      expect(list.status).toBe(200);
      expect(list.body.items.map((item: { id: string }) => item.id)).toContain(base[name]);
      const one = await api.get(resource, base[name], { sessionId: session() });
      expect(one.status).toBe(200);
      expect(one.body[resource.key].id).toBe(base[name]);
    });

    it('does not see another organization’s record (404, not in the list)', async () => {
      const one = await api.get(resource, foreign[name], { sessionId: session() });
      expect(one.status).toBe(404);
      expect(one.body.error.code).toBe('not_found');
      const list = await api.list(resource, {
        sessionId: session(),
        query: 'pageSize=200&includeArchived=true',
      });
      expect(list.body.items.map((item: { id: string }) => item.id)).not.toContain(foreign[name]);
    });

    it(`${allowed ? 'creates, updates and archives, each with an audit row' : 'is refused create, update and archive (403), nothing written'}`, async () => {
      const mark = await lastAuditId();
      const created = await api.create(resource, { sessionId: session(), body: body() });
      if (!allowed) {
        expect(created.status).toBe(403);
        expect(created.body.error.code).toBe('forbidden');
        const updated = await api.update(resource, base[name], {
          sessionId: session(),
          body: { ...change, version: 1 },
        });
        expect(updated.status).toBe(403);
        const removed = await api.remove(resource, base[name], {
          sessionId: session(),
          query: 'mode=archive',
        });
        expect(removed.status).toBe(403);
        expect(await auditSince(lab.id, mark)).toEqual([]);
        const still = await api.get(resource, base[name], { sessionId: session() });
        expect(still.body[resource.key]).toMatchObject({ version: 1, archivedAt: null });
        return;
      }
      expect(created.status, JSON.stringify(created.body)).toBe(201);
      const record = created.body[resource.key];
      expect(record).toMatchObject({ version: 1, archivedAt: null });

      const updated = await api.update(resource, record.id, {
        sessionId: session(),
        body: { ...change, version: 1 },
      });
      expect(updated.status, JSON.stringify(updated.body)).toBe(200);
      expect(updated.body[resource.key]).toMatchObject({ ...change, version: 2 });

      const archived = await api.remove(resource, record.id, {
        sessionId: session(),
        query: 'mode=archive',
      });
      expect(archived.status).toBe(200);
      expect(archived.body.outcome).toBe('archived');
      expect(archived.body[resource.key].archivedAt).not.toBeNull();

      const audit = await auditOf(resource.entityType, record.id);
      expect(audit.map((row) => row.action)).toEqual([
        `${resource.entityType}.create`,
        `${resource.entityType}.update`,
        `${resource.entityType}.archive`,
      ]);
      expect(audit.every((row) => row.actorUserId === lab.members[role].userId)).toBe(true);
      expect(audit.every((row) => row.organizationId === lab.id)).toBe(true);
      expect(audit[1].before).toMatchObject({ version: 1 });
      expect(audit[1].after).toMatchObject({ ...change, version: 2 });
    });

    it(`cannot change another organization’s record (${allowed ? '404' : '403'}), nothing written`, async () => {
      const mark = await lastAuditId();
      const updated = await api.update(resource, foreign[name], {
        sessionId: session(),
        body: { ...change, version: 1 },
      });
      expect(updated.status).toBe(allowed ? 404 : 403);
      const removed = await api.remove(resource, foreign[name], { sessionId: session() });
      expect(removed.status).toBe(allowed ? 404 : 403);
      expect(await auditSince(lab.id, mark)).toEqual([]);
      expect(await auditSince(otherLab.id, mark)).toEqual([]);
    });
  });
});
