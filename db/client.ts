import 'server-only';
import { drizzle, type PostgresJsDatabase } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import * as schema from './schema';
import { databaseUrl } from './url';

export type Database = PostgresJsDatabase<typeof schema>;

// One pool per process; Next's dev server reloads modules, so keep it on globalThis.
const globalForDb = globalThis as typeof globalThis & {
  beadlineSql?: postgres.Sql;
  beadlineDb?: Database;
};

export function getSql(): postgres.Sql {
  globalForDb.beadlineSql ??= postgres(databaseUrl(), {
    max: Number(process.env.DATABASE_POOL_SIZE ?? 10),
    onnotice: () => undefined,
  });
  return globalForDb.beadlineSql;
}

export function getDb(): Database {
  globalForDb.beadlineDb ??= drizzle(getSql(), { schema });
  return globalForDb.beadlineDb;
}

/** Closes the pool (scripts and tests). */
export async function closeDb(): Promise<void> {
  const sql = globalForDb.beadlineSql;
  globalForDb.beadlineSql = undefined;
  globalForDb.beadlineDb = undefined;
  if (sql) await sql.end({ timeout: 5 });
}
