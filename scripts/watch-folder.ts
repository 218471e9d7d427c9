/**
 * The watched-folder uploader for the camera PC: posts each new drop photo in DIR to Beadline's
 * API (POST /api/v1/photos) exactly once and prints each result.
 *
 *   npm run watch-folder -- --url URL --token TOKEN --sample ID --liquid ID [--method circle]
 *                           [--settle-ms 1500] [--once] DIR
 *
 * - A file is posted once it has stopped growing (same size and time for --settle-ms).
 * - What was sent is remembered in DIR/.beadline-sent.json, across restarts.
 * - Each file gets an Idempotency-Key before its first try, kept in that state file: a retry
 *   after a network failure, a 5xx or a 429 sends the same key, so the server analyses it once.
 * - A photo the server refuses (4xx) is reported and not sent again.
 * - --once posts what is there and stops (for scripts and tests); otherwise it keeps watching.
 */
import { randomUUID } from 'node:crypto';
import { watch } from 'node:fs';
import { readFile, readdir, rename, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { runCli } from './support/run-cli';

const PHOTO_EXTENSIONS = new Set(['.png', '.jpg', '.jpeg', '.tif', '.tiff', '.bmp']);
const STATE_FILE = '.beadline-sent.json';
const MAX_TRIES = 8;

type Entry = {
  idempotencyKey: string;
  size: number;
  mtimeMs: number;
  status: 'pending' | 'sent' | 'refused';
  result?: unknown;
  error?: string;
};
type State = { files: Record<string, Entry> };

type Options = {
  url: string;
  token: string;
  sample: string;
  liquid: string;
  method: string;
  settleMs: number;
  once: boolean;
  dir: string;
};

const USAGE =
  'Usage: npm run watch-folder -- --url URL --token TOKEN --sample ID --liquid ID [--method circle] [--settle-ms 1500] [--once] DIR';

function options(): Options | string {
  const { values, positionals } = parseArgs({
    allowPositionals: true,
    options: {
      url: { type: 'string' },
      token: { type: 'string' },
      sample: { type: 'string' },
      liquid: { type: 'string' },
      method: { type: 'string', default: 'circle' },
      'settle-ms': { type: 'string', default: '1500' },
      once: { type: 'boolean', default: false },
    },
  });
  const missing = (['url', 'token', 'sample', 'liquid'] as const).filter((k) => !values[k]);
  if (missing.length > 0) return `Missing ${missing.map((k) => `--${k}`).join(', ')}.\n${USAGE}`;
  if (positionals.length !== 1) return `Name exactly one folder to watch.\n${USAGE}`;
  const settleMs = Number(values['settle-ms']);
  if (!Number.isFinite(settleMs) || settleMs < 0)
    return `--settle-ms is a number of milliseconds.\n${USAGE}`;
  return {
    url: values.url!.replace(/\/+$/, ''),
    token: values.token!,
    sample: values.sample!,
    liquid: values.liquid!,
    method: values.method!,
    settleMs,
    once: values.once!,
    dir: path.resolve(positionals[0]),
  };
}

async function loadState(dir: string): Promise<State> {
  try {
    return JSON.parse(await readFile(path.join(dir, STATE_FILE), 'utf8')) as State;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return { files: {} };
    throw new Error(`${STATE_FILE} in ${dir} is not readable JSON; fix or remove it.`, {
      cause: error,
    });
  }
}

/** Written to a temporary file and renamed, so a crash never leaves half a state file. */
async function saveState(dir: string, state: State) {
  const file = path.join(dir, STATE_FILE);
  await writeFile(`${file}.tmp`, JSON.stringify(state, null, 2));
  await rename(`${file}.tmp`, file);
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Waits until the file keeps its size and time for `settleMs` (the camera finished writing). */
async function waitUntilWritten(file: string, settleMs: number) {
  let before = await stat(file);
  for (;;) {
    await sleep(settleMs);
    const after = await stat(file);
    if (after.size === before.size && after.mtimeMs === before.mtimeMs && after.size > 0)
      return after;
    before = after;
  }
}

function describeResult(name: string, result: Record<string, unknown>): string {
  const r = (result.result ?? {}) as Record<string, number | undefined>;
  const deg = (v: number | undefined) => (typeof v === 'number' ? `${v.toFixed(1)}°` : '—');
  return `${name}: left ${deg(r.leftDeg)}, right ${deg(r.rightDeg)}, mean ${deg(r.meanDeg)} (drop ${String(result.dropId)}, revision ${String(result.revision)})`;
}

async function post(
  opts: Options,
  file: string,
  entry: Entry,
): Promise<{ status: number; body: unknown }> {
  const bytes = await readFile(file);
  const form = new FormData();
  form.set('sampleId', opts.sample);
  form.set('probeLiquidId', opts.liquid);
  form.set('method', opts.method);
  form.set('photo', new Blob([new Uint8Array(bytes)]), path.basename(file));
  const response = await fetch(`${opts.url}/api/v1/photos`, {
    method: 'POST',
    headers: { authorization: `Bearer ${opts.token}`, 'idempotency-key': entry.idempotencyKey },
    body: form,
  });
  const text = await response.text();
  let body: unknown = text;
  try {
    body = JSON.parse(text);
  } catch {
    // Not JSON (a proxy's error page): kept as text for the message.
  }
  const retryAfter = Number(response.headers.get('retry-after'));
  if (response.status === 429 || response.status >= 500) {
    const error = new Error(`the server answered ${response.status}`) as Error & {
      waitMs?: number;
    };
    if (Number.isFinite(retryAfter) && retryAfter > 0) error.waitMs = retryAfter * 1000;
    throw error;
  }
  return { status: response.status, body };
}

async function send(opts: Options, state: State, name: string) {
  const file = path.join(opts.dir, name);
  const written = await waitUntilWritten(file, opts.settleMs);
  let entry = state.files[name];
  if (entry?.status === 'sent' || entry?.status === 'refused') {
    if (entry.size === written.size && entry.mtimeMs === written.mtimeMs) return;
  }
  if (!entry || entry.status !== 'pending') {
    // The key is kept before the first try, so a retry after a restart sends the same one.
    entry = {
      idempotencyKey: randomUUID(),
      size: written.size,
      mtimeMs: written.mtimeMs,
      status: 'pending',
    };
    state.files[name] = entry;
    await saveState(opts.dir, state);
  }
  for (let attempt = 1; ; attempt++) {
    try {
      const { status, body } = await post(opts, file, entry);
      if (status === 201 || status === 200) {
        Object.assign(entry, { status: 'sent', result: body, error: undefined });
        await saveState(opts.dir, state);
        console.log(describeResult(name, body as Record<string, unknown>));
      } else {
        const message =
          (body as { error?: { message?: string } })?.error?.message ??
          `the server answered ${status}`;
        Object.assign(entry, { status: 'refused', error: message });
        await saveState(opts.dir, state);
        console.log(`${name}: refused (${status}): ${message}`);
      }
      return;
    } catch (error) {
      const waitMs =
        (error as { waitMs?: number }).waitMs ?? Math.min(60_000, 1000 * 2 ** (attempt - 1));
      if (attempt >= MAX_TRIES && opts.once) {
        console.error(
          `${name}: not sent after ${attempt} tries (${String((error as Error).message)}); it is sent again next run.`,
        );
        return;
      }
      console.error(
        `${name}: ${String((error as Error).message)}; trying again in ${Math.round(waitMs / 1000)} s with the same key.`,
      );
      await sleep(waitMs);
    }
  }
}

async function photosIn(dir: string): Promise<string[]> {
  const entries = await readdir(dir, { withFileTypes: true });
  return entries
    .filter((e) => e.isFile() && PHOTO_EXTENSIONS.has(path.extname(e.name).toLowerCase()))
    .map((e) => e.name)
    .sort();
}

async function main(): Promise<number> {
  const opts = options();
  if (typeof opts === 'string') {
    console.error(opts);
    return 2;
  }
  const state = await loadState(opts.dir);
  let queue = Promise.resolve();
  const queued = new Set<string>();
  const enqueue = (name: string) => {
    if (queued.has(name)) return;
    queued.add(name);
    queue = queue.then(() => send(opts, state, name)).finally(() => queued.delete(name));
  };
  for (const name of await photosIn(opts.dir)) enqueue(name);
  if (opts.once) {
    await queue;
    return 0;
  }
  console.log(`Watching ${opts.dir} for drop photos (Ctrl-C to stop).`);
  watch(opts.dir, (_event, name) => {
    if (name && PHOTO_EXTENSIONS.has(path.extname(name).toLowerCase())) {
      stat(path.join(opts.dir, name)).then(
        (s) => s.isFile() && enqueue(name),
        () => undefined,
      );
    }
  });
  await new Promise(() => undefined);
  return 0;
}

runCli(main);
