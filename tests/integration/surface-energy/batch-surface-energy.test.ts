/**
 * Surface energy of a whole batch (GET/POST /api/batches/[id]/surface-energy) and the
 * surface-energy verdict of the comparison, read from PostgreSQL.
 */
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { loadComparison } from '@/db/queries/comparison';
import { surfaceEnergyResults } from '@/db/schema';
import { buildComparison, batchesOutOfSpec, SURFACE_ENERGY_LABEL } from '@/lib/compare';
import * as batchEnergyRoute from '@/app/api/batches/[id]/surface-energy/route';
import { api, bodies, createLab, ensureLibrary, resources, type Lab } from '../records/helpers';
import { owrkByHand } from '../../support/owrk-by-hand';
import { insertDrop, insertSample } from '../support/seed';
import { addDrop, call, idParams } from './helpers';

let lab: Lab;
let otherLab: Lab;
let coatingId: string;
let batchId: string;
let emptyBatchId: string;
let foreignBatchId: string;

async function makeBatch(target: Lab, options: { samples: number; minSurfaceEnergyMnM?: number }) {
  const admin = target.members.admin.sessionId;
  const coating = await api.create(resources.coatings, {
    sessionId: admin,
    body: bodies.coating(),
  });
  const id = coating.body.coating.id as string;
  if (options.minSurfaceEnergyMnM !== undefined) {
    const spec = await api.create(resources.specs, {
      sessionId: admin,
      body: { ...bodies.spec(id), minDeg: null, minSurfaceEnergyMnM: options.minSurfaceEnergyMnM },
    });
    expect(spec.status, JSON.stringify(spec.body)).toBe(201);
  }
  const batch = await api.create(resources.batches, { sessionId: admin, body: bodies.batch(id) });
  const sampleIds: string[] = [];
  for (let i = 0; i < options.samples; i++) {
    const sample = await api.create(resources.samples, {
      sessionId: admin,
      body: bodies.sample(batch.body.batch.id),
    });
    sampleIds.push(sample.body.sample.id);
  }
  return { coatingId: id, batchId: batch.body.batch.id as string, sampleIds };
}

beforeAll(async () => {
  await ensureLibrary();
  lab = await createLab();
  otherLab = await createLab();
  const made = await makeBatch(lab, { samples: 2, minSurfaceEnergyMnM: 48 });
  coatingId = made.coatingId;
  batchId = made.batchId;
  const [p1, p2] = made.sampleIds;
  // Water 70°, 72° on P1 and 74° on P2; diiodomethane 40° on P1, 42° and 44° on P2 (invented).
  for (const [sample, deg] of [
    [p1, 70],
    [p1, 72],
    [p2, 74],
  ] as const)
    await addDrop(lab.id, sample, 'liquid-water', [{ meanDeg: deg, reviewStatus: 'approved' }]);
  for (const [sample, deg] of [
    [p1, 40],
    [p2, 42],
    [p2, 44],
  ] as const)
    await addDrop(lab.id, sample, 'liquid-diiodomethane', [
      { meanDeg: deg, reviewStatus: 'approved' },
    ]);
  emptyBatchId = (await makeBatch(lab, { samples: 1 })).batchId;
  foreignBatchId = (await makeBatch(otherLab, { samples: 1 })).batchId;
});

afterAll(async () => {
  await closeDb();
});

const path = (id: string) => `/api/batches/${id}/surface-energy`;

/** POST /api/batches/[id]/surface-energy with an empty body, as one of the lab's members. */
const saveBatchEnergy = (id: string, role: 'analyst' | 'viewer') =>
  call(batchEnergyRoute.POST, path(id), {
    method: 'POST',
    sessionId: lab.members[role].sessionId,
    params: idParams(id),
    body: {},
  });

describe('GET /api/batches/[id]/surface-energy', () => {
  it('pools the drops of every sample of the batch per probe liquid', async () => {
    const response = await call(batchEnergyRoute.GET, path(batchId), {
      sessionId: lab.members.viewer.sessionId,
      params: idParams(batchId),
    });
    expect(response.status).toBe(200);
    const { subject, angleTable, outputs } = response.body;
    expect(subject.kind).toBe('batch');
    expect(subject.sampleLabel).toBeNull();
    const water = angleTable.find(
      (r: { probeLiquidId: string }) => r.probeLiquidId === 'liquid-water',
    );
    const dim = angleTable.find(
      (r: { probeLiquidId: string }) => r.probeLiquidId === 'liquid-diiodomethane',
    );
    expect(water).toMatchObject({ n: 3 });
    expect(water.meanDeg).toBeCloseTo(72, 10);
    expect(dim).toMatchObject({ n: 3 });
    expect(dim.meanDeg).toBeCloseTo(42, 10);
    const owrk = outputs.results[0];
    expect(owrk.method).toBe('owrk');
    expect(owrk.components.gammaTotal.value).toBeCloseTo(owrkByHand(72, 42).total, 9);
    expect(subject.surfaceEnergySpecs[0].min).toBe(48);
  });

  it('answers 404 for another organization’s batch', async () => {
    const response = await call(batchEnergyRoute.GET, path(foreignBatchId), {
      sessionId: lab.members.admin.sessionId,
      params: idParams(foreignBatchId),
    });
    expect(response.status).toBe(404);
    expect(response.body.error.message).toMatch(/batch/i);
  });
});

describe('POST /api/batches/[id]/surface-energy', () => {
  it('saves the result with the batch and lists it', async () => {
    const saved = await call(batchEnergyRoute.POST, path(batchId), {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      params: idParams(batchId),
      body: { methods: ['owrk', 'zisman'] },
    });
    expect(saved.status, JSON.stringify(saved.body)).toBe(201);
    expect(saved.body.result.batchId).toBe(batchId);
    expect(saved.body.result.sampleId).toBeNull();
    const [row] = await getDb()
      .select()
      .from(surfaceEnergyResults)
      .where(eq(surfaceEnergyResults.id, saved.body.result.id));
    expect(row.batchId).toBe(batchId);
    expect((row.inputs as { subject: unknown }).subject).toEqual({ kind: 'batch', id: batchId });
    const listed = await call(batchEnergyRoute.GET, path(batchId), {
      sessionId: lab.members.viewer.sessionId,
      params: idParams(batchId),
    });
    expect(listed.body.saved.map((r: { id: string }) => r.id)).toContain(saved.body.result.id);
  });

  it('says what to do for a batch without drops, and refuses viewers', async () => {
    const empty = await saveBatchEnergy(emptyBatchId, 'analyst');
    expect(empty.status).toBe(422);
    expect(empty.body.error.message).toMatch(/This batch has no analysed drops yet.*its samples/);
    const viewer = await saveBatchEnergy(batchId, 'viewer');
    expect(viewer.status).toBe(403);
  });
});

describe('surface-energy verdict of the comparison', () => {
  it('loads the liquids’ components and the limit, and fails the batch below 48 mN/m', async () => {
    const data = await loadComparison(lab.id, coatingId, { visibility: 'approved' });
    expect(data.specs[0].minSurfaceEnergyMnM).toBe(48);
    expect(data.liquids.find((l) => l.id === 'liquid-water')).toMatchObject({
      gammaTotal: 72.8,
      gammaDispersive: 21.8,
      gammaPolar: 51,
    });
    const comparison = buildComparison(data);
    const total = owrkByHand(72, 42).total;
    expect(total).toBeLessThan(48); // the invented angles were chosen to fall short
    const [row] = comparison.surfaceEnergy!.batches;
    expect(row.total?.value).toBeCloseTo(total, 9);
    expect(row.verdict.outcome).toBe('fail');
    expect(batchesOutOfSpec(comparison).map((b) => b.liquidName)).toContain(SURFACE_ENERGY_LABEL);
  });
});

describe('spec check with a days-since-treatment window', () => {
  it('the surface-energy page counts the drops the compare page counts, by one rule', async () => {
    const admin = lab.members.admin.sessionId;
    const coating = await api.create(resources.coatings, {
      sessionId: admin,
      body: bodies.coating(),
    });
    const id = coating.body.coating.id as string;
    const spec = await api.create(resources.specs, {
      sessionId: admin,
      body: { ...bodies.spec(id), minDeg: null, minSurfaceEnergyMnM: 42, maxDaysSinceTreatment: 7 },
    });
    expect(spec.status, JSON.stringify(spec.body)).toBe(201);
    const batch = await api.create(resources.batches, { sessionId: admin, body: bodies.batch(id) });
    const windowBatchId = batch.body.batch.id as string;
    const treatedAt = new Date('2026-03-01T08:00:00Z');
    const sampleId = await insertSample(lab.id, windowBatchId, 'W1', treatedAt);
    const day = (n: number) => new Date(treatedAt.getTime() + n * 86_400_000);
    // Invented angles: within 7 days water 95°, 97°, 96° and diiodomethane 42°, 44°, 43°; a fortnight
    // later the film has been re-cleaned and wets better (water 60°), which must not count.
    for (const [liquid, deg, age] of [
      ['liquid-water', 95, 1],
      ['liquid-water', 97, 2],
      ['liquid-water', 96, 3],
      ['liquid-water', 60, 14],
      ['liquid-water', 62, 15],
      ['liquid-diiodomethane', 42, 1],
      ['liquid-diiodomethane', 44, 2],
      ['liquid-diiodomethane', 43, 3],
      ['liquid-diiodomethane', 30, 14],
    ] as const) {
      await insertDrop(lab.id, sampleId, {
        probeLiquidId: liquid,
        measuredAt: day(age),
        revisions: [{ meanDeg: deg, reviewStatus: 'approved' }],
      });
    }
    const response = await call(batchEnergyRoute.GET, path(windowBatchId), {
      sessionId: lab.members.viewer.sessionId,
      params: idParams(windowBatchId),
    });
    expect(response.status).toBe(200);
    const [window] = response.body.specWindows;
    expect(window).toMatchObject({ maxDaysSinceTreatment: 7, counted: 6, excluded: 3 });
    const windowTotal = window.outputs.results[0].components.gammaTotal.value;
    expect(windowTotal).toBeCloseTo(owrkByHand(96, 43).total, 9);
    // Every drop together would meet the limit; the drops within the window do not.
    expect(response.body.outputs.results[0].components.gammaTotal.value).toBeGreaterThan(42);
    expect(windowTotal).toBeLessThan(42);

    // The compare page judges the same drops and reaches the same value.
    const comparison = buildComparison(
      await loadComparison(lab.id, id, { visibility: 'approved' }),
    );
    const [row] = comparison.surfaceEnergy!.batches;
    expect(row.excluded).toBe(3);
    expect(row.total?.value).toBeCloseTo(windowTotal, 9);
    expect(row.verdict.outcome).toBe('fail');
  });
});
