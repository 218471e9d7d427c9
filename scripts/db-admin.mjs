// Database chores on the server in DATABASE_ADMIN_URL (scripts/lib.sh):
//   create NAME | recreate NAME
//   relax-durability NAME  a test database only: commits return before their WAL reaches the
//                          disk, which is fine for data that is rebuilt on every run
//   app-role NAME          creates (or resets) the login role the web app connects as, with the
//                          password in BEADLINE_APP_ROLE_PASSWORD and no superuser, CREATEDB,
//                          CREATEROLE, replication or row-security bypass; db/migrate.ts grants
//                          it what it needs, table by table
import postgres from 'postgres';

const [command, name] = process.argv.slice(2);
if (!/^[a-z][a-z0-9_]*$/.test(name ?? '')) {
  console.error(`db-admin: invalid name "${name}"`);
  process.exit(2);
}
const sql = postgres(process.env.DATABASE_ADMIN_URL, { max: 1, onnotice: () => {} });

async function ensureAppRole() {
  const password = process.env.BEADLINE_APP_ROLE_PASSWORD;
  if (!password) throw new Error('BEADLINE_APP_ROLE_PASSWORD is not set');
  const exists = (await sql`select 1 from pg_roles where rolname = ${name}`).length > 0;
  const [{ literal }] = await sql`select quote_literal(${password}) as literal`;
  await sql.unsafe(
    `${exists ? 'alter' : 'create'} role "${name}" with login nosuperuser nocreatedb ` +
      `nocreaterole noreplication nobypassrls noinherit password ${literal}`,
  );
}

async function database() {
  const exists = (await sql`select 1 from pg_database where datname = ${name}`).length > 0;
  if (command === 'recreate' && exists) {
    await sql.unsafe(`drop database "${name}" with (force)`);
  }
  if (command === 'relax-durability') {
    if (!name.endsWith('_test')) {
      throw new Error(`refusing to relax durability of "${name}": not a test database`);
    }
    await sql.unsafe(`alter database "${name}" set synchronous_commit = off`);
  } else if (command === 'recreate' || !exists) {
    await sql.unsafe(`create database "${name}"`);
  }
}

try {
  if (command === 'app-role') await ensureAppRole();
  else if (['create', 'recreate', 'relax-durability'].includes(command)) await database();
  else throw new Error(`unknown command "${command}"`);
} finally {
  await sql.end();
}
