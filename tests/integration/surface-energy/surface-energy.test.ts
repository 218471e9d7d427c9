/**
 * Surface energy of a sample: the angle table (latest revision of each drop; approved only for
 * viewers), the calculation and save route handlers, and the demo PP-Print sample.
 */
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { DEMO_ORGANIZATION } from '@/db/demo';
import { batches, coatings, organizations, samples } from '@/db/schema';
import { angleTable as listAngleTable } from '@/server/surface-energy/evaluate';
import { angleTableToLiquids, computeSurfaceEnergy } from '@/lib/surface-energy/compute';
import * as calculateRoute from '@/app/api/surface-energy/calculate/route';
import * as sampleEnergyRoute from '@/app/api/samples/[id]/surface-energy/route';
import { api, bodies, createLab, ensureLibrary, resources, type Lab } from '../records/helpers';
import { addDrop, call, idParams } from './helpers';

let lab: Lab;
let otherLab: Lab;
let sampleId: string;
let foreignSampleId: string;

async function makeSample(target: Lab): Promise<string> {
  const admin = target.members.admin.sessionId;
  const coating = await api.create(resources.coatings, {
    sessionId: admin,
    body: bodies.coating(),
  });
  await api.create(resources.specs, {
    sessionId: admin,
    body: { ...bodies.spec(coating.body.coating.id), minSurfaceEnergyMnM: 38 },
  });
  const batch = await api.create(resources.batches, {
    sessionId: admin,
    body: bodies.batch(coating.body.coating.id),
  });
  const sample = await api.create(resources.samples, {
    sessionId: admin,
    body: bodies.sample(batch.body.batch.id),
  });
  expect(sample.status).toBe(201);
  return sample.body.sample.id as string;
}

beforeAll(async () => {
  await ensureLibrary();
  lab = await createLab();
  otherLab = await createLab();
  sampleId = await makeSample(lab);
  foreignSampleId = await makeSample(otherLab);
  // Water: three drops. Drop 1 was re-analysed (rev 2 = 80°, approved); drop 2's latest
  // revision (81°) is a draft although rev 1 was approved; drop 3 is approved at 82°.
  await addDrop(lab.id, sampleId, 'liquid-water', [
    { meanDeg: 60, reviewStatus: 'approved' },
    { meanDeg: 80, reviewStatus: 'approved' },
  ]);
  await addDrop(lab.id, sampleId, 'liquid-water', [
    { meanDeg: 70, reviewStatus: 'approved' },
    { meanDeg: 81, reviewStatus: 'draft' },
  ]);
  await addDrop(lab.id, sampleId, 'liquid-water', [{ meanDeg: 82, reviewStatus: 'approved' }]);
  // Diiodomethane: two drops, both approved.
  await addDrop(lab.id, sampleId, 'liquid-diiodomethane', [
    { meanDeg: 40, reviewStatus: 'approved' },
  ]);
  await addDrop(lab.id, sampleId, 'liquid-diiodomethane', [
    { meanDeg: 42, reviewStatus: 'approved' },
  ]);
  await addDrop(otherLab.id, foreignSampleId, 'liquid-water', [
    { meanDeg: 30, reviewStatus: 'approved' },
  ]);
});

afterAll(async () => {
  await closeDb();
});

const path = (id: string) => `/api/samples/${id}/surface-energy`;

describe('angle table of a sample', () => {
  it('takes each drop’s latest revision for roles that read all results', async () => {
    const table = await listAngleTable(lab.id, { sampleId }, { visibility: 'all' });
    const water = table.find((r) => r.probeLiquidId === 'liquid-water');
    const diiodo = table.find((r) => r.probeLiquidId === 'liquid-diiodomethane');
    expect(water?.n).toBe(3);
    expect(water?.meanDeg).toBeCloseTo(81, 10); // (80 + 81 + 82) / 3
    expect(water?.sdDeg).toBeCloseTo(1, 10);
    expect(diiodo?.n).toBe(2);
    expect(diiodo?.meanDeg).toBeCloseTo(41, 10);
    expect(diiodo?.gammaDispersive).toBe(50.8);
    expect(diiodo?.hazardNote).toMatch(/Harmful/);
    expect(water?.sources.total).toMatch(/Ström/);
  });

  it('shows viewers only drops whose latest revision is approved', async () => {
    const response = await call(sampleEnergyRoute.GET, path(sampleId), {
      sessionId: lab.members.viewer.sessionId,
      params: idParams(sampleId),
    });
    expect(response.status).toBe(200);
    const water = response.body.angleTable.find(
      (r: { probeLiquidId: string }) => r.probeLiquidId === 'liquid-water',
    );
    // Drop 2's latest revision is a draft, so it is left out (its approved rev 1 is stale).
    expect(water.n).toBe(2);
    expect(water.meanDeg).toBeCloseTo(81, 10); // (80 + 82) / 2
    expect(response.body.readAll).toBe(false);
  });

  it('answers 404 for another organization’s sample', async () => {
    const response = await call(sampleEnergyRoute.GET, path(foreignSampleId), {
      sessionId: lab.members.analyst.sessionId,
      params: idParams(foreignSampleId),
    });
    expect(response.status).toBe(404);
  });

  it('computes OWRK with uncertainty, the regression plot and the envelope, and names the spec', async () => {
    const response = await call(
      sampleEnergyRoute.GET,
      `${path(sampleId)}?methods=owrk,wu,acid-base`,
      {
        sessionId: lab.members.analyst.sessionId,
        params: idParams(sampleId),
      },
    );
    expect(response.status).toBe(200);
    const { outputs, availability, subject } = response.body;
    const owrk = outputs.results.find((r: { method: string }) => r.method === 'owrk');
    expect(owrk.status).toBe('ok');
    expect(owrk.liquidsUsed.sort()).toEqual(['Diiodomethane', 'Water']);
    expect(owrk.components.gammaTotal.value).toBeGreaterThan(30);
    expect(owrk.components.gammaTotal.standardUncertainty).toBeGreaterThan(0);
    expect(outputs.owrkPlot.points).toHaveLength(2);
    expect(outputs.envelope.points.length).toBeGreaterThan(10);
    const acidBase = availability.find((a: { method: string }) => a.method === 'acid-base');
    expect(acidBase.available).toBe(false);
    expect(acidBase.reason).toMatch(/three liquids/);
    expect(outputs.results.find((r: { method: string }) => r.method === 'acid-base').status).toBe(
      'unavailable',
    );
    expect(subject.surfaceEnergySpecs[0].min).toBe(38);
  });
});

describe('saving a result with the sample', () => {
  it('stores the inputs it was computed from and lists it', async () => {
    const saved = await call(sampleEnergyRoute.POST, path(sampleId), {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      params: idParams(sampleId),
      body: { methods: ['owrk', 'fowkes'] },
    });
    expect(saved.status, JSON.stringify(saved.body)).toBe(201);
    const listed = await call(sampleEnergyRoute.GET, path(sampleId), {
      sessionId: lab.members.analyst.sessionId,
      params: idParams(sampleId),
    });
    const result = listed.body.saved.find((r: { id: string }) => r.id === saved.body.result.id);
    expect(result.sampleId).toBe(sampleId);
    expect(result.inputs.options.methods).toEqual(['owrk', 'fowkes']);
    const water = result.inputs.liquids.find(
      (l: { probeLiquidId: string }) => l.probeLiquidId === 'liquid-water',
    );
    expect(water).toMatchObject({ n: 3, gammaTotal: 72.8, gammaPolar: 51 });
    expect(water.meanDeg).toBeCloseTo(81, 10);
    expect(water.analysisIds).toHaveLength(3);
    expect(result.outputs.results.map((r: { method: string }) => r.method)).toEqual([
      'owrk',
      'fowkes',
    ]);
    // Recomputing from the stored inputs gives the stored outputs (seeded Monte Carlo).
    const again = computeSurfaceEnergy(
      angleTableToLiquids(result.inputs.liquids),
      result.inputs.options,
    );
    expect(again.results[0].components.gammaTotal).toEqual(
      result.outputs.results[0].components.gammaTotal,
    );
  });

  it('is refused to viewers and reviewers', async () => {
    for (const role of ['viewer', 'reviewer'] as const) {
      const response = await call(sampleEnergyRoute.POST, path(sampleId), {
        method: 'POST',
        sessionId: lab.members[role].sessionId,
        params: idParams(sampleId),
        body: {},
      });
      expect(response.status).toBe(403);
    }
  });

  it('names the field of a bad method', async () => {
    const response = await call(sampleEnergyRoute.POST, path(sampleId), {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      params: idParams(sampleId),
      body: { methods: ['owrk', 'guesswork'] },
    });
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toHaveProperty(['methods.1']);
  });
});

describe('POST /api/surface-energy/calculate', () => {
  const water = { name: 'Water', gammaTotal: 72.8, gammaDispersive: 21.8, gammaPolar: 51 };
  const diiodo = { name: 'Diiodomethane', gammaTotal: 50.8, gammaDispersive: 50.8, gammaPolar: 0 };

  it('computes from liquids and angles alone, for every role', async () => {
    const response = await call(calculateRoute.POST, '/api/surface-energy/calculate', {
      method: 'POST',
      sessionId: lab.members.viewer.sessionId,
      body: {
        liquids: [
          { ...water, angleDeg: 70, angleSdDeg: 1.5, n: 5 },
          { ...diiodo, angleDeg: 40, angleSdDeg: 1, n: 5 },
        ],
        methods: ['owrk', 'wu'],
      },
    });
    expect(response.status).toBe(200);
    const [owrk, wu] = response.body.outputs.results;
    expect(owrk.status).toBe('ok');
    expect(wu.status).toBe('ok');
    // Closed form, OWRK (Owens & Wendt 1969) by hand: γSd = (50.8(1+cos40°)/(2√50.8))²
    // = 39.8 mN/m from diiodomethane alone (γLp = 0 puts its point on the axis).
    expect(owrk.components.gammaDispersive.value).toBeCloseTo(
      (50.8 * (1 + Math.cos((40 * Math.PI) / 180))) ** 2 / (4 * 50.8),
      6,
    );
  });

  it('rejects bad input and names each field', async () => {
    const response = await call(calculateRoute.POST, '/api/surface-energy/calculate', {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: {
        liquids: [
          { ...water, angleDeg: 190 },
          { ...diiodo, gammaPolar: 5, angleDeg: 'forty' },
        ],
      },
    });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_input');
    expect(Object.keys(response.body.error.fields)).toEqual(
      expect.arrayContaining(['liquids.0.angleDeg', 'liquids.1.angleDeg']),
    );
  });

  it('rejects an empty liquid list', async () => {
    const response = await call(calculateRoute.POST, '/api/surface-energy/calculate', {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: { liquids: [] },
    });
    expect(response.status).toBe(400);
    expect(response.body.error.fields.liquids).toMatch(/at least one liquid/);
  });
});

describe('demo PP-Print sample F-2611 / D1', async () => {
  const [demo] = await getDb()
    .select({ id: organizations.id })
    .from(organizations)
    .where(eq(organizations.slug, DEMO_ORGANIZATION.slug));
  it.skipIf(!demo)('has an OWRK total within the usual range of well-treated PP film', async () => {
    const [sample] = await getDb()
      .select({ id: samples.id })
      .from(samples)
      .innerJoin(batches, eq(batches.id, samples.batchId))
      .innerJoin(coatings, eq(coatings.id, batches.coatingId))
      .where(
        and(
          eq(samples.organizationId, demo.id),
          eq(coatings.code, 'PP-Print'),
          eq(batches.lotCode, 'F-2611'),
          eq(samples.label, 'D1'),
        ),
      );
    expect(sample, 'the demo seed should hold PP-Print F-2611 / D1').toBeDefined();
    const table = await listAngleTable(demo.id, { sampleId: sample.id }, { visibility: 'all' });
    expect(table.map((r) => r.probeLiquidId).sort()).toEqual([
      'liquid-diiodomethane',
      'liquid-water',
    ]);
    const outputs = computeSurfaceEnergy(angleTableToLiquids(table), {
      methods: ['owrk'],
      uncertaintyBasis: 'mean',
      envelopeAngleDeg: 0,
    });
    const total = outputs.results[0].components.gammaTotal;
    // Common practice, no source: untreated PP film is near 30 mN/m; a well-treated film is
    // taken as about 36–50 mN/m, plasma treatment reaching the mid-50s. The demo's D1 angles
    // (water ≈ 58°, diiodomethane ≈ 38°) give ≈ 53.7 mN/m, so the upper bound here is 56.
    expect(total.value).toBeGreaterThanOrEqual(36);
    expect(total.value).toBeLessThanOrEqual(56);
    expect(total.standardUncertainty).toBeGreaterThan(0);
    expect(total.standardUncertainty).toBeLessThan(5);
  });
});
