/**
 * The web app connects as a role of its own (DATABASE_URL) that may read and write rows but owns
 * nothing: it cannot rewrite or remove audit rows, nor switch off the trigger that guards them.
 */
import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb, getSql } from '@/db/client';
import { recordAudit } from '@/db/queries/audit';
import { closeMailQueue, getBoss } from '@/server/mail/queue';
import { createOrganization } from '../support/fixtures';
import { ownerConnection } from '../support/owner-db';

/** The database's own message for a statement run as the app role. */
async function refusal(statement: string): Promise<string> {
  try {
    await getSql().unsafe(statement);
  } catch (error) {
    return (error as Error).message;
  }
  return 'no error';
}

let rowId: number;

beforeAll(async () => {
  const lab = await createOrganization();
  await getDb().transaction((tx) =>
    recordAudit(tx, {
      actorUserId: null,
      organizationId: lab.id,
      action: 'test.app_role',
      entityType: 'test',
    }),
  );
  const [row] = await getSql()<{ id: number }[]>`
    select id from audit_events where organization_id = ${lab.id}`;
  rowId = row!.id;
});

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

describe('the app role', () => {
  it('is no superuser and owns no table, and is not the role that runs the migrations', async () => {
    const [me] = await getSql()<{ name: string; superuser: boolean; createdb: boolean; createrole: boolean }[]>`
      select rolname as name, rolsuper as superuser, rolcreatedb as createdb, rolcreaterole as createrole
      from pg_roles where rolname = current_user`;
    expect(me).toMatchObject({ superuser: false, createdb: false, createrole: false });
    const owned = await getSql()`
      select c.relname from pg_class c join pg_namespace n on n.oid = c.relnamespace
      where n.nspname in ('public', 'pgboss', 'drizzle') and pg_get_userbyid(c.relowner) = current_user`;
    expect(owned).toEqual([]);
    const owner = new URL(process.env.DATABASE_OWNER_URL ?? '').username;
    expect(me!.name).not.toBe(owner);
  });

  it('cannot UPDATE, DELETE or TRUNCATE audit rows', async () => {
    expect(await refusal(`update audit_events set action = 'test.rewritten' where id = ${rowId}`)).toMatch(
      /permission denied/,
    );
    expect(await refusal(`delete from audit_events where id = ${rowId}`)).toMatch(/permission denied/);
    expect(await refusal('truncate audit_events')).toMatch(/permission denied/);
    const [row] = await getSql()<{ action: string }[]>`select action from audit_events where id = ${rowId}`;
    expect(row?.action).toBe('test.app_role');
  });

  it('cannot disable the append-only trigger, or every trigger by replication mode', async () => {
    expect(await refusal('alter table audit_events disable trigger audit_events_append_only')).toMatch(
      /must be owner/,
    );
    expect(await refusal('alter table audit_events disable trigger all')).toMatch(/must be owner/);
    expect(await refusal('set session_replication_role = replica')).toMatch(/permission denied/);
    expect(await refusal('drop trigger audit_events_append_only on audit_events')).toMatch(/must be owner/);
  });

  it('reads and writes the rows of every table in public, audit rows only read and added', async () => {
    const rights = await getSql()<
      { table: string; select: boolean; insert: boolean; update: boolean; delete: boolean }[]
    >`
      select c.relname as table,
             has_table_privilege(c.oid, 'select') as select,
             has_table_privilege(c.oid, 'insert') as insert,
             has_table_privilege(c.oid, 'update') as update,
             has_table_privilege(c.oid, 'delete') as delete
      from pg_class c join pg_namespace n on n.oid = c.relnamespace
      where n.nspname = 'public' and c.relkind in ('r', 'p') order by 1`;
    expect(rights.map((r) => r.table)).toEqual(
      expect.arrayContaining(['analyses', 'audit_events', 'pending_sign_ups', 'users']),
    );
    for (const r of rights) {
      const audit = r.table === 'audit_events';
      expect(r, r.table).toEqual({
        table: r.table,
        select: true,
        insert: true,
        update: !audit,
        delete: !audit,
      });
    }
  });

  it('gets the same rights on a table the owner adds later, with no grant of its own', async () => {
    const owner = ownerConnection();
    const table = `app_role_later_${randomBytes(4).toString('hex')}`;
    try {
      await owner.sql.unsafe(`create table "${table}" (id serial primary key, note text)`);
      await getSql().unsafe(`insert into "${table}" (note) values ('from the app')`);
      const rows = await getSql().unsafe(`update "${table}" set note = 'changed' returning note`);
      expect(rows).toEqual([{ note: 'changed' }]);
      await getSql().unsafe(`delete from "${table}"`);
    } finally {
      await owner.sql.unsafe(`drop table if exists "${table}"`);
      await owner.end();
    }
  });

  it('cannot create tables or change the schema', async () => {
    expect(await refusal('create table app_role_probe (id int)')).toMatch(/permission denied/);
    expect(await refusal('alter table users add column probe int')).toMatch(/must be owner/);
  });

  it('runs the job queue: creates a queue of its own, sends and takes a job, deletes an empty queue', async () => {
    const boss = await getBoss();
    const queue = `app-role-${randomBytes(4).toString('hex')}`;
    await boss.createQueue(queue);
    const id = await boss.send(queue, { hello: 'queue' });
    expect(id).toBeTruthy();
    const [job] = await boss.fetch<{ hello: string }>(queue);
    expect(job?.data).toEqual({ hello: 'queue' });
    await boss.complete(queue, job!.id);
    const empty = `${queue}-empty`;
    await boss.createQueue(empty);
    expect(await boss.getQueue(empty)).toMatchObject({ name: empty });
    await boss.deleteQueue(empty);
    expect(await boss.getQueue(empty)).toBeNull();
  });
});
