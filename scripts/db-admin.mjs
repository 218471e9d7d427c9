// Creates or re-creates a database on the server in DATABASE_ADMIN_URL (scripts/lib.sh).
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
  if (command === 'recreate' || !exists) {
    await sql.unsafe(`create database "${name}"`);
  }
} finally {
  await sql.end();
}
