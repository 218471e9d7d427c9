import { randomBytes } from 'node:crypto';
import postgres from 'postgres';
import { describe, expect, it } from 'vitest';
import { runMigrations } from '@/db/migrate';

describe('migrations', () => {
  it('apply to an empty database, and a second run changes nothing', async () => {
    const adminUrl = process.env.DATABASE_ADMIN_URL ?? process.env.DATABASE_URL;
    expect(adminUrl, 'DATABASE_ADMIN_URL is set by scripts/test.sh').toBeTruthy();
    const name = `beadline_scratch_${randomBytes(4).toString('hex')}`;
    const admin = postgres(adminUrl!, { max: 1, onnotice: () => undefined });
    await admin.unsafe(`create database "${name}"`);
    const url = new URL(adminUrl!);
    url.pathname = `/${name}`;
    try {
      await runMigrations(url.toString());
      await runMigrations(url.toString());
      const sql = postgres(url.toString(), { max: 1 });
      const tables = await sql<{ table_name: string }[]>`
        select table_name from information_schema.tables where table_schema = 'public' order by 1`;
      await sql.end();
      expect(tables.map((t) => t.table_name)).toEqual(
        expect.arrayContaining([
          'audit_events',
          'invitations',
          'memberships',
          'organizations',
          'sessions',
          'sign_in_attempts',
          'users',
        ]),
      );
    } finally {
      await admin.unsafe(`drop database "${name}" with (force)`);
      await admin.end();
    }
  });
});
