import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import * as schema from '@/db/schema';

/**
 * A connection as the owner of the tables (DATABASE_OWNER_URL, set by scripts/test.sh), for the
 * maintenance that the web app's own role (DATABASE_URL) may not do. Close it with `end()`.
 */
export function ownerConnection() {
  const url = process.env.DATABASE_OWNER_URL || process.env.DATABASE_URL!;
  const sql = postgres(url, { max: 2, onnotice: () => undefined });
  return { sql, db: drizzle(sql, { schema }), end: () => sql.end({ timeout: 5 }) };
}
