/**
 * Backup and restore of everything Beadline keeps: the database (Debian's pg_dump / pg_restore
 * of the server's own major version) and the photos in the local upload stand-in.
 *
 *   npm run db:backup [-- FILE]          FILE defaults to .data/backups/beadline-<time>.tar.gz
 *   npm run db:restore -- FILE [--force]
 *
 * Run through scripts/db-backup.sh, which starts the private cluster when needed and exports
 * DATABASE_OWNER_URL (the owner of the tables: pg_dump and pg_restore run as it),
 * DATABASE_ADMIN_URL (restore recreates the database) and DATABASE_URL (the app's role, which
 * the migrations run after a restore grant its rights again).
 *
 * The archive holds manifest.json, database.dump (pg_dump's custom format) and uploads/files/
 * (the stand-in's files and their records; none with the hosted upload service, whose files stay
 * there). Secrets are not in it: no passwords, not the stand-in's key.
 *
 * Restore refuses while anything else is connected to the database (stop `npm start` first;
 * --force ends those connections), first writes a backup of what is there now to
 * .data/backups/before-restore-<time>.tar.gz and moves the current upload folder aside, then
 * recreates the database, restores the dump into it, and runs the migrations (which also grant
 * the app's role its rights and bring an older backup up to date).
 */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { cp, mkdir, mkdtemp, readFile, readdir, rename, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import postgres from 'postgres';
import { runMigrations } from '../db/migrate';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const DATA_DIR = path.join(ROOT, '.data');
const FORMAT = 'beadline-backup';

type Manifest = {
  format: typeof FORMAT;
  version: 1;
  createdAt: string;
  database: string;
  serverVersion: string;
  uploads: { kind: 'local'; files: number } | { kind: 'hosted' };
};

class BackupError extends Error {}

function env(name: string): string {
  const value = process.env[name];
  if (!value) throw new BackupError(`${name} is not set; run this through npm run db:backup / db:restore.`);
  return value;
}

const ownerUrl = () => env('DATABASE_OWNER_URL');
const adminUrl = () => process.env.DATABASE_ADMIN_URL || ownerUrl();
const uploadsDir = () => path.resolve(process.env.UPLOAD_FAKE_DATA_DIR || path.join(DATA_DIR, 'uploads'));
const hostedUploads = () => !!process.env.UPLOADTHING_TOKEN?.trim();

function stamp(): string {
  return new Date().toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
}

function databaseName(url: string): string {
  return decodeURIComponent(new URL(url).pathname.replace(/^\//, ''));
}

function userName(url: string): string {
  return decodeURIComponent(new URL(url).username);
}

/** Debian's client of the server's major version (postgresql-client-N), e.g. pg_dump. */
async function pgTool(tool: 'pg_dump' | 'pg_restore'): Promise<{ bin: string; serverVersion: string }> {
  const sql = postgres(ownerUrl(), { max: 1, onnotice: () => undefined });
  let serverVersion: string;
  let major: number;
  try {
    const [row] = await sql<{ version: string; num: string }[]>`
      select current_setting('server_version') as version, current_setting('server_version_num') as num`;
    serverVersion = row!.version;
    major = Math.floor(Number(row!.num) / 10000);
  } finally {
    await sql.end();
  }
  const bin = `/usr/lib/postgresql/${major}/bin/${tool}`;
  if (!existsSync(bin)) {
    throw new BackupError(
      `${bin} is missing: the server runs PostgreSQL ${major}; install Debian's ` +
        `postgresql-client-${major} (apt-get install postgresql-client-${major}) and try again.`,
    );
  }
  return { bin, serverVersion };
}

function run(bin: string, args: string[]): void {
  execFileSync(bin, args, { stdio: ['ignore', 'inherit', 'inherit'] });
}

async function countFiles(dir: string): Promise<number> {
  if (!existsSync(dir)) return 0;
  return (await readdir(dir)).filter((name) => !name.endsWith('.json')).length;
}

/** Writes the archive; returns its path. */
export async function backup(out?: string): Promise<string> {
  const { bin, serverVersion } = await pgTool('pg_dump');
  const target = path.resolve(out ?? path.join(DATA_DIR, 'backups', `beadline-${stamp()}.tar.gz`));
  await mkdir(path.dirname(target), { recursive: true });
  const staging = await mkdtemp(path.join(tmpdir(), 'beadline-backup-'));
  try {
    run(bin, ['--format=custom', `--file=${path.join(staging, 'database.dump')}`, `--dbname=${ownerUrl()}`]);
    let uploads: Manifest['uploads'] = { kind: 'hosted' };
    if (!hostedUploads()) {
      const files = path.join(uploadsDir(), 'files');
      await mkdir(path.join(staging, 'uploads'), { recursive: true });
      if (existsSync(files)) await cp(files, path.join(staging, 'uploads', 'files'), { recursive: true });
      uploads = { kind: 'local', files: await countFiles(files) };
    }
    const manifest: Manifest = {
      format: FORMAT,
      version: 1,
      createdAt: new Date().toISOString(),
      database: databaseName(ownerUrl()),
      serverVersion,
      uploads,
    };
    await writeFile(path.join(staging, 'manifest.json'), `${JSON.stringify(manifest, null, 2)}\n`);
    const partial = `${target}.partial`;
    run('tar', ['-czf', partial, '-C', staging, '.']);
    await rename(partial, target);
    const photos = uploads.kind === 'local' ? `${uploads.files} stored photo file(s)` : 'no photos (hosted upload service)';
    console.log(`[backup] ${target}: database ${manifest.database} (PostgreSQL ${serverVersion}) and ${photos}`);
    return target;
  } finally {
    await rm(staging, { recursive: true, force: true });
  }
}

async function otherConnections(): Promise<string[]> {
  const sql = postgres(adminUrl(), { max: 1, onnotice: () => undefined });
  try {
    const rows = await sql<{ application: string }[]>`
      select coalesce(nullif(application_name, ''), 'unnamed client') as application
      from pg_stat_activity where datname = ${databaseName(ownerUrl())} and pid <> pg_backend_pid()`;
    return rows.map((r) => r.application);
  } finally {
    await sql.end();
  }
}

async function recreateDatabase(): Promise<void> {
  const name = databaseName(ownerUrl()).replace(/"/g, '""');
  const owner = userName(ownerUrl()).replace(/"/g, '""');
  const sql = postgres(adminUrl(), { max: 1, onnotice: () => undefined });
  try {
    await sql.unsafe(`drop database if exists "${name}" with (force)`);
    await sql.unsafe(
      userName(adminUrl()) === userName(ownerUrl())
        ? `create database "${name}"`
        : `create database "${name}" owner "${owner}"`,
    );
  } catch (error) {
    throw new BackupError(
      `Could not recreate the database (${(error as Error).message}). Restoring needs ` +
        'DATABASE_ADMIN_URL: a role that may drop and create it.',
    );
  } finally {
    await sql.end();
  }
}

export async function restore(archive: string, options: { force?: boolean } = {}): Promise<void> {
  const source = path.resolve(archive);
  if (!existsSync(source)) throw new BackupError(`There is no backup at ${source}.`);
  const staging = await mkdtemp(path.join(tmpdir(), 'beadline-restore-'));
  try {
    try {
      run('tar', ['-xzf', source, '-C', staging]);
    } catch {
      throw new BackupError(`${source} is not a Beadline backup (tar.gz made by npm run db:backup).`);
    }
    let manifest: Manifest;
    try {
      manifest = JSON.parse(await readFile(path.join(staging, 'manifest.json'), 'utf8')) as Manifest;
    } catch {
      throw new BackupError(`${source} has no readable manifest.json; it is not a Beadline backup.`);
    }
    if (manifest.format !== FORMAT || !existsSync(path.join(staging, 'database.dump'))) {
      throw new BackupError(`${source} is not a Beadline backup.`);
    }
    const { bin } = await pgTool('pg_restore');
    const others = await otherConnections();
    if (others.length > 0 && !options.force) {
      throw new BackupError(
        `${others.length} other connection(s) use the database (${[...new Set(others)].join(', ')}). ` +
          'Stop npm start (and anything else using it) and try again, or add --force to end them.',
      );
    }
    const safety = await backup(path.join(DATA_DIR, 'backups', `before-restore-${stamp()}.tar.gz`));
    console.log(`[restore] what was there before is kept in ${safety}`);

    await recreateDatabase();
    run(bin, [
      '--no-owner',
      '--no-acl',
      '--exit-on-error',
      '--single-transaction',
      `--dbname=${ownerUrl()}`,
      path.join(staging, 'database.dump'),
    ]);
    const appUser = process.env.DATABASE_URL ? userName(process.env.DATABASE_URL) : '';
    await runMigrations(ownerUrl(), { appRole: appUser && appUser !== userName(ownerUrl()) ? appUser : null });

    if (manifest.uploads.kind === 'local' && !hostedUploads()) {
      const dir = uploadsDir();
      if (existsSync(dir)) {
        const aside = `${dir}.before-restore-${stamp()}`;
        await rename(dir, aside);
        console.log(`[restore] the upload folder as it was is kept in ${aside}`);
      }
      await mkdir(dir, { recursive: true });
      const files = path.join(staging, 'uploads', 'files');
      if (existsSync(files)) await cp(files, path.join(dir, 'files'), { recursive: true });
    } else if (manifest.uploads.kind === 'local') {
      console.warn('[restore] the backup holds stand-in photos, but UPLOADTHING_TOKEN is set: they were not restored.');
    }
    console.log(
      `[restore] ${source} (made ${manifest.createdAt}) restored into ${databaseName(ownerUrl())}` +
        (manifest.uploads.kind === 'local' ? ` with ${manifest.uploads.files} stored photo file(s)` : ''),
    );
  } finally {
    await rm(staging, { recursive: true, force: true });
  }
}

async function main(): Promise<void> {
  const [command, ...rest] = process.argv.slice(2);
  const files = rest.filter((a) => !a.startsWith('--'));
  if (command === 'backup') {
    await backup(files[0]);
  } else if (command === 'restore') {
    if (!files[0]) throw new BackupError('Say which backup to restore: npm run db:restore -- FILE');
    await restore(files[0], { force: rest.includes('--force') });
  } else {
    throw new BackupError('Usage: db-backup.ts backup [FILE] | restore FILE [--force]');
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((error: unknown) => {
    console.error(
      error instanceof BackupError ? `[db] ${error.message}` : ['[db] failed:', error].join(' '),
    );
    process.exit(1);
  });
}
