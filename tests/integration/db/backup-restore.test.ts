/**
 * npm run db:backup and npm run db:restore, run as commands against a database of their own:
 * what was backed up comes back (rows, the append-only audit trigger, the app role's rights,
 * the stored photos), what came later is gone, and what was replaced is kept aside.
 */
import { execFile } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync } from 'node:fs';
import { mkdir, mkdtemp, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runMigrations } from '@/db/migrate';

const exec = promisify(execFile);
const adminUrl = process.env.DATABASE_ADMIN_URL!;
const appUrlOfTests = new URL(process.env.DATABASE_URL!);
const ownerUrlOfTests = new URL(process.env.DATABASE_OWNER_URL ?? process.env.DATABASE_URL!);
const name = `beadline_backup_${randomBytes(4).toString('hex')}`;

function inDatabase(url: URL): string {
  const copy = new URL(url);
  copy.pathname = `/${name}`;
  return copy.toString();
}

const ownerUrl = inDatabase(ownerUrlOfTests);
const appUrl = inDatabase(appUrlOfTests);
const appRole = decodeURIComponent(appUrlOfTests.username);
let work: string;
let uploads: string;
let backupsBefore: Set<string>;

async function command(args: string[]) {
  try {
    const { stdout, stderr } = await exec('bash', ['scripts/db-backup.sh', ...args], {
      env: {
        ...process.env,
        DATABASE_URL: appUrl,
        DATABASE_OWNER_URL: ownerUrl,
        DATABASE_ADMIN_URL: adminUrl,
        UPLOAD_FAKE_DATA_DIR: uploads,
        UPLOADTHING_TOKEN: '',
      },
      maxBuffer: 10 * 1024 * 1024,
    });
    return { code: 0, out: stdout + stderr };
  } catch (error) {
    const failed = error as { code: number; stdout: string; stderr: string };
    return { code: failed.code, out: failed.stdout + failed.stderr };
  }
}

async function withApp<T>(run: (sql: postgres.Sql) => Promise<T>): Promise<T> {
  const sql = postgres(appUrl, { max: 1, onnotice: () => undefined });
  try {
    return await run(sql);
  } finally {
    await sql.end();
  }
}

async function backupsOnDisk(): Promise<string[]> {
  const dir = path.join(process.cwd(), '.data', 'backups');
  return existsSync(dir) ? readdir(dir) : [];
}

beforeAll(async () => {
  const admin = postgres(adminUrl, { max: 1, onnotice: () => undefined });
  await admin.unsafe(`create database "${name}"`);
  await admin.end();
  await runMigrations(ownerUrl, { appRole: appRole === decodeURIComponent(ownerUrlOfTests.username) ? null : appRole });
  work = await mkdtemp(path.join(tmpdir(), 'beadline-backup-test-'));
  uploads = path.join(work, 'uploads');
  await mkdir(path.join(uploads, 'files'), { recursive: true });
  await writeFile(path.join(uploads, 'files', 'photoKeyA'), Buffer.from([137, 80, 78, 71, 1, 2, 3]));
  await writeFile(path.join(uploads, 'files', 'photoKeyA.json'), '{"key":"photoKeyA"}');
  await withApp(async (sql) => {
    await sql`insert into organizations (id, name, slug) values ('org-kept', 'Kept lab', 'kept-lab')`;
    await sql`insert into audit_events (organization_id, action, entity_type) values ('org-kept', 'test.kept', 'test')`;
  });
  backupsBefore = new Set(await backupsOnDisk());
});

afterAll(async () => {
  const admin = postgres(adminUrl, { max: 1, onnotice: () => undefined });
  await admin.unsafe(`drop database if exists "${name}" with (force)`);
  await admin.end();
  for (const file of await backupsOnDisk()) {
    if (!backupsBefore?.has(file) && file.startsWith('before-restore-')) {
      await rm(path.join(process.cwd(), '.data', 'backups', file), { force: true });
    }
  }
  if (work) await rm(work, { recursive: true, force: true });
});

describe('db:backup and db:restore', () => {
  it('round-trips the database and the stored photos', async () => {
    const archive = path.join(work, 'beadline.tar.gz');
    const made = await command(['backup', archive]);
    expect(made.out).toMatch(/1 stored photo file/);
    expect(made.code).toBe(0);

    // Later changes, and a lost photo.
    await withApp(async (sql) => {
      await sql`insert into organizations (id, name, slug) values ('org-later', 'Later lab', 'later-lab')`;
      await sql`update organizations set name = 'Renamed lab' where id = 'org-kept'`;
    });
    await rm(path.join(uploads, 'files', 'photoKeyA'));
    await writeFile(path.join(uploads, 'files', 'photoKeyB'), 'later');

    const restored = await command(['restore', archive]);
    expect(restored.out).toMatch(/restored into/);
    expect(restored.code).toBe(0);

    await withApp(async (sql) => {
      const orgs = await sql<{ id: string; name: string }[]>`select id, name from organizations order by id`;
      expect(orgs).toEqual([{ id: 'org-kept', name: 'Kept lab' }]);
      const audit = await sql<{ action: string }[]>`select action from audit_events where organization_id = 'org-kept'`;
      expect(audit.map((a) => a.action)).toEqual(['test.kept']);
      // The app role's rights are back, and so is the append-only guard.
      await expect(sql`delete from audit_events`).rejects.toThrow(/permission denied/);
      await sql`insert into organizations (id, name, slug) values ('org-after', 'After lab', 'after-lab')`;
    });
    const owner = postgres(ownerUrl, { max: 1, onnotice: () => undefined });
    try {
      await expect(owner`delete from audit_events`).rejects.toThrow(/append-only/);
      const [{ n }] = await owner<{ n: number }[]>`select count(*)::int as n from pgboss.version`;
      expect(n).toBe(1);
    } finally {
      await owner.end();
    }
    expect(await readFile(path.join(uploads, 'files', 'photoKeyA'))).toEqual(
      Buffer.from([137, 80, 78, 71, 1, 2, 3]),
    );
    expect(existsSync(path.join(uploads, 'files', 'photoKeyB'))).toBe(false);
    // What restore replaced is kept: the upload folder beside it, the database in a backup.
    const aside = (await readdir(work)).filter((f) => f.startsWith('uploads.before-restore-'));
    expect(aside).toHaveLength(1);
    expect(await readFile(path.join(work, aside[0]!, 'files', 'photoKeyB'), 'utf8')).toBe('later');
    const safety = (await backupsOnDisk()).filter((f) => !backupsBefore.has(f) && f.startsWith('before-restore-'));
    expect(safety).toHaveLength(1);
  });

  it('refuses to restore while something else uses the database, and says what to do', async () => {
    const archive = path.join(work, 'beadline.tar.gz');
    const busy = postgres(appUrl, { max: 1, onnotice: () => undefined, connection: { application_name: 'busy-app' } });
    await busy`select 1`;
    try {
      const refused = await command(['restore', archive]);
      expect(refused.code).not.toBe(0);
      expect(refused.out).toMatch(/busy-app.*Stop npm start/s);
      const [{ n }] = await busy<{ n: number }[]>`select count(*)::int as n from organizations where id = 'org-after'`;
      expect(n).toBe(1);
    } finally {
      await busy.end();
    }
  });

  it('says so when the file is not a backup', async () => {
    const bogus = path.join(work, 'bogus.tar.gz');
    await writeFile(bogus, 'not an archive');
    const refused = await command(['restore', bogus]);
    expect(refused.code).not.toBe(0);
    expect(refused.out).toMatch(/not a Beadline backup/);
  });
});
