/**
 * A stored analysis can be reproduced from what is stored with it: the photo, the method, the
 * baseline and the analysis settings (lib/analysis/settings.ts) kept in `analyses.result`. And the
 * migration that renamed the engine's warning codes to snake_case rewrites stored rows.
 * (Reproduction is checked against the engine itself; no outside source needed.)
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { closeDb, getDb } from '@/db/client';
import { analyses } from '@/db/schema';
import { POST } from '@/app/api/photos/[id]/drop/route';
import { analyseDrop } from '@/lib/analysis';
import { DEFAULT_SETTINGS } from '@/lib/analysis/settings';
import type { KeptAnalysisResult } from '@/lib/contracts/drops';
import type { Baseline, FitMethod } from '@/lib/analysis/types';
import { decodeImageBytes } from '@/lib/analysis/node/decode';
import { apiRequest } from '../support/request';
import type { createMember } from '../support/fixtures';
import { insertPhotoWithBytes, labWithSample } from '../support/seed';

const FIXTURE = path.resolve(__dirname, '../../../fixtures/drops/drop-90-tilted.png');
let analyst: Awaited<ReturnType<typeof createMember>>;
let sampleId: string;
let photoId: string;
let bytes: Buffer;

beforeAll(async () => {
  const setup = await labWithSample('R-1', 'L-R');
  ({ analyst, sampleId } = setup);
  bytes = await readFile(FIXTURE);
  photoId = await insertPhotoWithBytes(setup.lab.id, analyst.userId, bytes);
});

afterAll(async () => {
  await closeDb();
});

/** The photo's drop revision the next save is based on (saves carry expectedRevision; every
 * save after the first is a re-analysis, which says why). */
let latestRevision = 0;

async function save(body: Record<string, unknown>) {
  const response = await POST(
    apiRequest(`/api/photos/${photoId}/drop`, {
      method: 'POST',
      sessionId: analyst.sessionId,
      body: { reason: 'reproduce', ...body, expectedRevision: latestRevision },
    }),
    { params: Promise.resolve({ id: photoId }) },
  );
  if (response.status === 201) latestRevision += 1;
  return response;
}

async function storedRow(analysisId: string) {
  const [row] = await getDb().select().from(analyses).where(eq(analyses.id, analysisId));
  return row;
}

describe('stored analyses are reproducible', () => {
  it('with the default settings and the automatic baseline', async () => {
    const response = await save({ sampleId, probeLiquidId: 'liquid-water', method: 'young-laplace', baseline: null });
    expect(response.status).toBe(201);
    const { analysisId } = await response.json();
    const row = await storedRow(analysisId);
    const settings = (row.result as KeptAnalysisResult).settings;
    expect(settings).toEqual(DEFAULT_SETTINGS);
    const again = await analyseDrop(await decodeImageBytes(bytes), {
      method: row.method as FitMethod,
      ...(row.baseline ? { baseline: row.baseline } : {}),
      settings,
    });
    expect(again.leftDeg).toBe(row.leftDeg);
    expect(again.rightDeg).toBe(row.rightDeg);
  });

  it('with settings of its own and a hand baseline: the settings are stored, and give the same angles again', async () => {
    const baseline: Baseline = { x1: 0, y1: 313, x2: 639, y2: 346.5 };
    const own = { fitMarginPx: 5, circleContactWindow: 0.3, denoiseSigmaPx: 1.4 };
    const response = await save({ sampleId, probeLiquidId: 'liquid-water', method: 'circle', baseline, settings: own });
    expect(response.status).toBe(201);
    const { analysisId } = await response.json();
    const row = await storedRow(analysisId);
    const settings = (row.result as KeptAnalysisResult).settings;
    expect(settings).toEqual({ ...DEFAULT_SETTINGS, ...own });
    const image = await decodeImageBytes(bytes);
    const again = await analyseDrop(image, { method: 'circle', baseline: row.baseline as Baseline, settings });
    expect(again.leftDeg).toBe(row.leftDeg);
    expect(again.rightDeg).toBe(row.rightDeg);
    // The settings matter: the defaults give a different reading of the same drop.
    const defaults = await analyseDrop(image, { method: 'circle', baseline });
    expect(defaults.leftDeg).not.toBe(row.leftDeg);
  });

  it('refuses a setting that is not a number, naming it', async () => {
    const response = await save({
      sampleId,
      probeLiquidId: 'liquid-water',
      method: 'circle',
      baseline: null,
      settings: { fitMarginPx: 'wide' },
    });
    expect(response.status).toBe(400);
  });
});

describe('snake_case warning codes in stored analyses (migration 0011)', () => {
  it('rewrites the codes of existing rows and leaves everything else as it was', async () => {
    const response = await save({ sampleId, probeLiquidId: 'liquid-water', method: 'circle', baseline: null });
    const { analysisId } = await response.json();
    const before = await storedRow(analysisId);
    const legacy = {
      ...before.result,
      warnings: [
        { code: 'left-right-disagree', message: 'Left and right angles differ by 2.4°.' },
        { code: 'low-contrast', message: 'Weak contrast.' },
        { code: 'needle_in_contact', message: 'Already snake_case.' },
      ],
    };
    const db = getDb();
    await db.update(analyses).set({ result: legacy as unknown as KeptAnalysisResult }).where(eq(analyses.id, analysisId));
    const sql = await readFile(path.resolve(__dirname, '../../../db/migrations/0011_analysis_codes_snake_case.sql'), 'utf8');
    await db.execute(sql);
    const after = await storedRow(analysisId);
    expect((after.result as KeptAnalysisResult).warnings).toEqual([
      { code: 'left_right_disagree', message: 'Left and right angles differ by 2.4°.' },
      { code: 'low_contrast', message: 'Weak contrast.' },
      { code: 'needle_in_contact', message: 'Already snake_case.' },
    ]);
    expect({ ...after.result, warnings: [] }).toEqual({ ...legacy, warnings: [] });
    expect(after.leftDeg).toBe(before.leftDeg);
  });
});
