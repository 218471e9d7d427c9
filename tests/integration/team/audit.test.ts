import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { auditEvents, organizations, sessions, users } from '@/db/schema';
import { listAuditEvents, recordAudit } from '@/db/queries/audit';
import { closeMailQueue } from '@/server/mail/queue';
import { signIn } from '@/app/(auth)/actions';
import { signOut } from '@/app/(app)/actions';
import { ROLES } from '@/lib/auth/permissions';
import { requestState, simulateRequest } from '../support/request';
import { createMember, createOrganization, TEST_PASSWORD } from '../support/fixtures';
import { ownerConnection } from '../support/owner-db';
import { auditRows, form, redirectOf } from './support';

const BASE_URL = process.env.E2E_BASE_URL;
// The trigger is the line behind the app role's missing privileges (tests/integration/db/
// app-role.test.ts): it must hold for the owner of the tables too.
const owner = ownerConnection();

afterAll(async () => {
  await owner.end();
  await closeMailQueue();
  await closeDb();
});

/** One audit row in its own transaction. */
const auditOne = (organizationId: string, action: string, actorUserId: string | null = null) =>
  getDb().transaction((tx) =>
    recordAudit(tx, { actorUserId, organizationId, action, entityType: 'test' }),
  );

describe('sign-in and sign-out are audited', () => {
  it('a successful sign-in writes auth.sign_in with its session; a failed one writes nothing', async () => {
    const lab = await createOrganization();
    const member = await createMember(lab.id, 'reviewer');
    simulateRequest({ sessionId: null });
    const failed = await signIn({}, form({ email: member.email, password: 'wrong password' }));
    expect(failed.code).toBe('invalid_credentials');
    expect(await auditRows({ action: 'auth.sign_in', entityId: member.userId })).toHaveLength(0);

    simulateRequest({ sessionId: null });
    expect(
      await redirectOf(signIn({}, form({ email: member.email, password: TEST_PASSWORD }))),
    ).toBe('/dashboard');
    const rows = await auditRows({ action: 'auth.sign_in', entityId: member.userId });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ organizationId: lab.id, actorUserId: member.userId });
    const sessionId = requestState.cookies.get('beadline_session');
    expect(sessionId).toBeTruthy();

    simulateRequest({ sessionId: sessionId! });
    expect(await redirectOf(signOut())).toBe('/sign-in');
    expect(await getDb().select().from(sessions).where(eq(sessions.id, sessionId!))).toHaveLength(
      0,
    );
    const out = await auditRows({ action: 'auth.sign_out', entityId: member.userId });
    expect(out).toHaveLength(1);
    expect(out[0]).toMatchObject({ organizationId: lab.id });
  });
});

/** The database's own message (drizzle wraps it as the cause). */
async function databaseError(run: PromiseLike<unknown>): Promise<string> {
  try {
    await run;
  } catch (error) {
    const cause = (error as { cause?: { message?: string } }).cause;
    return cause?.message ?? (error as Error).message;
  }
  return 'no error';
}

describe('audit_events is append-only in the database', () => {
  let lab: { id: string };
  let rowId: number;

  beforeAll(async () => {
    lab = await createOrganization();
    await auditOne(lab.id, 'test.event');
    rowId = (await auditRows({ organizationId: lab.id, action: 'test.event' }))[0]!.id;
  });

  it('refuses UPDATE', async () => {
    expect(
      await databaseError(
        owner.db
          .update(auditEvents)
          .set({ action: 'test.rewritten' })
          .where(eq(auditEvents.id, rowId)),
      ),
    ).toMatch(/append-only/);
    expect((await auditRows({ organizationId: lab.id }))[0]!.action).toBe('test.event');
  });

  it('refuses DELETE and TRUNCATE', async () => {
    expect(
      await databaseError(owner.db.delete(auditEvents).where(eq(auditEvents.id, rowId))),
    ).toMatch(/append-only/);
    expect(await databaseError(owner.db.execute(sql`truncate audit_events`))).toMatch(
      /append-only/,
    );
    expect(await auditRows({ organizationId: lab.id })).toHaveLength(1);
  });

  it('allows the owner a deliberate purge inside a transaction that sets beadline.allow_audit_purge', async () => {
    await owner.db.transaction(async (tx) => {
      await tx.execute(sql`set local beadline.allow_audit_purge = 'on'`);
      await tx.delete(auditEvents).where(eq(auditEvents.id, rowId));
    });
    expect(await auditRows({ organizationId: lab.id })).toHaveLength(0);
    // The setting ends with its transaction.
    await auditOne(lab.id, 'test.event');
    const [again] = await auditRows({ organizationId: lab.id });
    expect(
      await databaseError(owner.db.delete(auditEvents).where(eq(auditEvents.id, again!.id))),
    ).toMatch(/append-only/);
  });
});

describe('what the trigger still lets through', () => {
  it('deleting an account keeps its audit rows and only clears the actor (the foreign key)', async () => {
    const lab = await createOrganization();
    const member = await createMember(lab.id, 'viewer');
    await auditOne(lab.id, 'test.actor', member.userId);
    await getDb().delete(users).where(eq(users.id, member.userId));
    const [row] = await auditRows({ organizationId: lab.id, action: 'test.actor' });
    expect(row).toMatchObject({ actorUserId: null, action: 'test.actor' });
  });

  it('deleting an organization needs the owner and the purge setting, since its audit rows go with it', async () => {
    const lab = await createOrganization();
    await auditOne(lab.id, 'test.org');
    expect(
      await databaseError(owner.db.delete(organizations).where(eq(organizations.id, lab.id))),
    ).toMatch(/append-only/);
    // The app's role cannot purge, even with the setting: the cascade needs the owner.
    expect(
      await databaseError(
        getDb().transaction(async (tx) => {
          await tx.execute(sql`set local beadline.allow_audit_purge = 'on'`);
          await tx.delete(organizations).where(eq(organizations.id, lab.id));
        }),
      ),
    ).toMatch(/append-only/);
    await owner.db.transaction(async (tx) => {
      await tx.execute(sql`set local beadline.allow_audit_purge = 'on'`);
      await tx.delete(organizations).where(eq(organizations.id, lab.id));
    });
    expect(await auditRows({ organizationId: lab.id })).toHaveLength(0);
  });
});

describe('listAuditEvents', () => {
  it('filters by action, entity type, actor and date range, newest first, in pages', async () => {
    const lab = await createOrganization();
    const actor = await createMember(lab.id, 'admin');
    await getDb().transaction(async (tx) => {
      for (let i = 0; i < 55; i++) {
        await recordAudit(tx, {
          actorUserId: i % 2 ? actor.userId : null,
          organizationId: lab.id,
          action: i % 5 ? 'test.touch' : 'test.mark',
          entityType: i % 3 ? 'sample' : 'batch',
          entityId: String(i),
        });
      }
    });
    const all = await listAuditEvents(lab.id, {}, 1);
    expect(all.total).toBe(55);
    expect(all.rows).toHaveLength(50);
    expect(all.rows[0]!.entityId).toBe('54');
    expect((await listAuditEvents(lab.id, {}, 2)).rows.map((r) => r.entityId)).toEqual([
      '4',
      '3',
      '2',
      '1',
      '0',
    ]);
    expect((await listAuditEvents(lab.id, { action: 'test.mark' }, 1)).total).toBe(11);
    expect((await listAuditEvents(lab.id, { entityType: 'batch' }, 1)).total).toBe(19);
    const mine = await listAuditEvents(lab.id, { actorUserId: actor.userId }, 1);
    expect(mine.total).toBe(27);
    expect(mine.rows[0]).toMatchObject({ actorEmail: actor.email });
    const tomorrow = new Date(Date.now() + 86_400_000);
    expect((await listAuditEvents(lab.id, { from: tomorrow }, 1)).total).toBe(0);
    expect(
      (await listAuditEvents(lab.id, { to: tomorrow, from: new Date(Date.now() - 86_400_000) }, 1))
        .total,
    ).toBe(55);
    const other = await createOrganization();
    expect((await listAuditEvents(other.id, {}, 1)).total).toBe(0);
  });
});

describe.skipIf(!BASE_URL)('audit page /audit on the running server', () => {
  for (const role of ROLES) {
    it(`${role}: ${role === 'admin' ? '200 with the log' : '403'}`, async () => {
      const lab = await createOrganization();
      const member = await createMember(lab.id, role);
      await auditOne(lab.id, 'test.visible', member.userId);
      const response = await fetch(`${BASE_URL}/audit?action=test.visible`, {
        redirect: 'manual',
        headers: { cookie: `beadline_session=${member.sessionId}` },
      });
      expect(response.status).toBe(role === 'admin' ? 200 : 403);
      const html = await response.text();
      // The entry as a table cell (the filter value itself is in the page's URL either way).
      const entry = /<td[^>]*>test\.visible<\/td>/;
      if (role === 'admin') expect(html).toMatch(entry);
      else expect(html).not.toMatch(entry);
    });
  }
});
