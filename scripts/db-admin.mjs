// Creates or re-creates a database on the server in DATABASE_ADMIN_URL (scripts/lib.sh).
//   create NAME | recreate NAME | relax-durability NAME (a test database only: commits return
//   before their WAL reaches the disk, which is fine for data that is rebuilt on every run).
import postgres from 'postgres';

const [command, name] = process.argv.slice(2);
if (!/^[a-z][a-z0-9_]*$/.test(name ?? '')) {
  console.error(`db-admin: invalid database name "${name}"`);
  process.exit(2);
}
const sql = postgres(process.env.DATABASE_ADMIN_URL, { max: 1, onnotice: () => {} });
try {
  const exists = (await sql`select 1 from pg_database where datname = ${name}`).length > 0;
  if (command === 'recreate' && exists) {
    await sql.unsafe(`drop database "${name}" with (force)`);
  }
  if (command === 'relax-durability') {
    if (!name.endsWith('_test')) throw new Error(`refusing to relax durability of "${name}": not a test database`);
    await sql.unsafe(`alter database "${name}" set synchronous_commit = off`);
  } else if (command === 'recreate' || !exists) {
    await sql.unsafe(`create database "${name}"`);
  }
} finally {
  await sql.end();
}
