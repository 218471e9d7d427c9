import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import postgres from 'postgres';
import { afterAll, describe, expect, it } from 'vitest';

const adminUrl = process.env.DATABASE_ADMIN_URL ?? process.env.DATABASE_URL!;
const admin = postgres(adminUrl, { max: 1, onnotice: () => undefined });

afterAll(async () => {
  await admin.end();
});

describe('the PostgreSQL server keeps every acknowledged write', () => {
  it('runs with fsync, full_page_writes and synchronous_commit on', async () => {
    const rows = await admin<{ name: string; setting: string }[]>`
      select name, setting from pg_settings
      where name in ('fsync', 'full_page_writes', 'synchronous_commit') order by name`;
    expect(Object.fromEntries(rows.map((r) => [r.name, r.setting]))).toEqual({
      fsync: 'on',
      full_page_writes: 'on',
      synchronous_commit: 'on',
    });
  });

  it('trades durability for speed on test databases only', async () => {
    const relaxed = await admin<{ datname: string; config: string[] }[]>`
      select d.datname, s.setconfig as config
      from pg_db_role_setting s join pg_database d on d.oid = s.setdatabase
      where exists (select 1 from unnest(s.setconfig) c
                    where c ~* '^(synchronous_commit|fsync|full_page_writes)=(off|false|no|0)$')`;
    for (const row of relaxed) expect(row.datname, row.config.join(', ')).toMatch(/_test$/);
  });
});

describe('scripts/lib.sh make_config_durable', () => {
  it('takes the settings of earlier releases out of an existing cluster configuration', () => {
    const conf = path.join(mkdtempSync(path.join(tmpdir(), 'beadline-pgconf-')), 'postgresql.conf');
    writeFileSync(
      conf,
      [
        "listen_addresses = '127.0.0.1'",
        'fsync = off',
        "synchronous_commit = 'off'   # faster",
        'full_page_writes=off',
        '#fsync = off',
        'shared_buffers = 128MB',
        '',
      ].join('\n'),
    );
    const out = execFileSync(
      'bash',
      ['-c', 'source scripts/lib.sh && make_config_durable "$1" && echo "changed=$DURABLE_CONFIG_CHANGED"', 'x', conf],
      { encoding: 'utf8' },
    );
    expect(out).toContain('changed=1');
    expect(readFileSync(conf, 'utf8')).toBe(
      ["listen_addresses = '127.0.0.1'", '#fsync = off', 'shared_buffers = 128MB', ''].join('\n'),
    );
    const again = execFileSync(
      'bash',
      ['-c', 'source scripts/lib.sh && make_config_durable "$1" && echo "changed=$DURABLE_CONFIG_CHANGED"', 'x', conf],
      { encoding: 'utf8' },
    );
    expect(again).toContain('changed=0');
  });
});
