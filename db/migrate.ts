import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import PgBoss from 'pg-boss';
import postgres from 'postgres';
import { fileURLToPath } from 'node:url';

export const migrationsFolder = fileURLToPath(new URL('./migrations', import.meta.url));

/** The job queue's schema (server/mail/queue.ts); pg-boss's default. */
const QUEUE_SCHEMA = 'pgboss';

/**
 * Applies every committed migration that the database has not seen yet, and installs (or
 * upgrades) the job queue's schema, all as the role in `url`: the owner of the tables. With
 * `appRole` (the web app's own login role, when it is not the owner) it then grants that role
 * exactly what the app needs (grantAppRole). Safe to run again: nothing changes the second time.
 */
export async function runMigrations(
  url: string,
  options: { appRole?: string | null } = {},
): Promise<void> {
  const sql = postgres(url, { max: 1, onnotice: () => undefined });
  try {
    await migrate(drizzle(sql), { migrationsFolder });
    await installJobQueue(url);
    if (options.appRole) await grantAppRole(sql, options.appRole);
  } finally {
    await sql.end({ timeout: 5 });
  }
}

/**
 * pg-boss creates and upgrades its schema when it starts; starting it here, as the owner, means
 * the app's role never needs to create anything. Nothing else runs: no supervision, no schedule.
 */
async function installJobQueue(url: string): Promise<void> {
  const boss = new PgBoss({
    connectionString: url,
    schema: QUEUE_SCHEMA,
    max: 1,
    supervise: false,
    schedule: false,
    migrate: true,
    application_name: 'beadline-migrate',
  });
  boss.on('error', (error: unknown) => console.error('[db] job queue:', error));
  await boss.start();
  await boss.stop({ graceful: false, wait: true });
}

/**
 * The web app's privileges, and nothing more:
 * - read and write the rows of every table in `public`, but only read and add audit_events
 *   (no UPDATE, DELETE or TRUNCATE; the append-only trigger stays as a second line);
 * - no ownership, so no ALTER TABLE (it cannot disable a trigger) and no DDL at all;
 * - the job queue's rows; a new queue is a partition of pgboss.job, which only the owner may
 *   create, so pg-boss's create_queue/delete_queue functions run with their owner's rights
 *   (SECURITY DEFINER, fixed search_path) and only this role may call them.
 * The grants name no table: they cover every table in the schemas, now (repeated on each run)
 * and later (default privileges of the owner), so a new table needs no grant of its own.
 */
export async function grantAppRole(sql: postgres.Sql, appRole: string): Promise<void> {
  const role = sql(appRole);
  const schema = sql(QUEUE_SCHEMA);
  await sql.begin(async (tx) => {
    await tx`grant usage on schema public to ${role}`;
    await tx`grant select, insert, update, delete on all tables in schema public to ${role}`;
    await tx`grant usage, select on all sequences in schema public to ${role}`;
    // Tables and sequences the owner creates later (the next migrations) get the same rights.
    await tx`alter default privileges in schema public
             grant select, insert, update, delete on tables to ${role}`;
    await tx`alter default privileges in schema public grant usage, select on sequences to ${role}`;
    await tx`revoke update, delete, truncate, references, trigger on audit_events from ${role}`;

    await tx`grant usage on schema ${schema} to ${role}`;
    await tx`grant select, insert, update, delete on all tables in schema ${schema} to ${role}`;
    await tx`grant usage, select on all sequences in schema ${schema} to ${role}`;
    // Partitions that create_queue makes later (as the owner) get the same rights.
    await tx`alter default privileges in schema ${schema}
             grant select, insert, update, delete on tables to ${role}`;
    for (const signature of ['create_queue(text, json)', 'delete_queue(text)']) {
      const fn = `${QUEUE_SCHEMA}.${signature}`;
      await tx.unsafe(`alter function ${fn} security definer`);
      await tx.unsafe(`alter function ${fn} set search_path = pg_catalog, ${QUEUE_SCHEMA}`);
      await tx.unsafe(`revoke all on function ${fn} from public`);
      await tx.unsafe(`grant execute on function ${fn} to "${appRole.replace(/"/g, '""')}"`);
    }
  });
}
