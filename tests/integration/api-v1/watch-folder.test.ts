import { execFile } from 'node:child_process';
import { copyFile, mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { ensureProbeLiquidLibrary } from '@/db/probe-liquid-library';
import { createMember, createOrganization } from '../support/fixtures';
import { insertBatch, insertCoating, insertSample } from '../support/seed';
import { makeToken } from './support';

const BASE_URL = process.env.E2E_BASE_URL;
const ROOT = path.resolve(__dirname, '../../..');
const FIXTURES = ['cap-60-noisy.png', 'cap-20-clean.png'];
const run = promisify(execFile);

let dir: string;
let token: string;
let sampleId: string;
let admin: Awaited<ReturnType<typeof createMember>>;

beforeAll(async () => {
  await ensureProbeLiquidLibrary(getDb());
  const lab = await createOrganization();
  admin = await createMember(lab.id, 'admin');
  const coatingId = await insertCoating(lab.id, 'WF-1');
  sampleId = await insertSample(lab.id, await insertBatch(lab.id, coatingId, 'L-WF'), 'S-WF');
  token = (await makeToken(lab.id, admin.userId, 'read-measure')).token;
  dir = await mkdtemp(path.join(tmpdir(), 'beadline-watch-'));
  for (const name of FIXTURES)
    await copyFile(path.join(ROOT, 'fixtures/drops', name), path.join(dir, name));
});

afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
  await closeDb();
});

const watchOnce = () =>
  run(
    'npx',
    [
      'tsx',
      'scripts/watch-folder.ts',
      '--url',
      BASE_URL!,
      '--token',
      token,
      '--sample',
      sampleId,
      '--liquid',
      'liquid-water',
      '--settle-ms',
      '200',
      '--once',
      dir,
    ],
    { cwd: ROOT, timeout: 240_000 },
  );

describe.skipIf(!BASE_URL)('the watched folder against the running server', () => {
  it('posts each photo once, prints its result, and sends nothing again on the next run', async () => {
    const first = await watchOnce();
    for (const name of FIXTURES) expect(first.stdout).toMatch(new RegExp(`${name}: left .*mean`));
    const state = JSON.parse(await readFile(path.join(dir, '.beadline-sent.json'), 'utf8'));
    expect(Object.values(state.files).map((f) => (f as { status: string }).status)).toEqual([
      'sent',
      'sent',
    ]);

    const second = await watchOnce();
    expect(second.stdout.trim()).toBe('');

    // The results are in the API, and on the page that shows the sample's results.
    const response = await fetch(`${BASE_URL}/api/v1/drops?sampleId=${sampleId}`, {
      headers: { authorization: `Bearer ${token}` },
    });
    const drops = (await response.json()) as {
      items: { photoId: string; latestAnalysis: { meanDeg: number } }[];
    };
    expect(drops.items).toHaveLength(2);
    const means = drops.items
      .map((d) => Math.round(d.latestAnalysis.meanDeg))
      .sort((a, b) => a - b);
    // Fixtures rendered as spherical caps of 20° and 60° (fixtures/generator); within 2°.
    expect(Math.abs(means[0] - 20)).toBeLessThanOrEqual(2);
    expect(Math.abs(means[1] - 60)).toBeLessThanOrEqual(2);
    for (const drop of drops.items) {
      const page = await fetch(`${BASE_URL}/api/photos/${drop.photoId}/drop`, {
        headers: { cookie: `beadline_session=${admin.sessionId}` },
      });
      expect(page.status).toBe(200);
      const shown = (await page.json()) as { drop: { sampleLabel: string } | null };
      expect(shown.drop?.sampleLabel).toBe('S-WF');
    }
  }, 300_000);
});
