/**
 * Bodies are validated with the shared schemas (400 invalid_input naming each field), cross-field
 * rules hold for the record as it will be after a partial update, and the built-in probe-liquid
 * library is seeded once with stable ids.
 */
import { eq, isNull } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { ensureProbeLiquidLibrary, PROBE_LIQUID_LIBRARY } from '@/db/probe-liquid-library';
import { probeLiquids } from '@/db/schema';
import {
  api,
  auditSince,
  bodies,
  createLab,
  labWithBatch,
  lastAuditId,
  resources,
  type Lab,
} from './helpers';
import { APP_ORIGIN } from '../support/request';

let lab: Lab;
let admin: string;
let coatingId: string;

beforeAll(async () => {
  ({ lab, admin, coatingId } = await labWithBatch());
});

afterAll(async () => {
  await closeDb();
});

describe('validation', () => {
  it('names each invalid field and writes nothing', async () => {
    const mark = await lastAuditId();
    const cases: [keyof typeof resources, unknown, string[]][] = [
      ['coatings', { code: '', name: 'x' }, ['code']],
      [
        'specs',
        { coatingId, probeLiquidId: 'liquid-water', scope: 'mean', minDeg: 120, maxDeg: 100 },
        ['maxDeg'],
      ],
      ['specs', { coatingId, probeLiquidId: 'liquid-water', scope: 'mean' }, ['minDeg']],
      [
        'specs',
        { coatingId, probeLiquidId: 'liquid-water', scope: 'median', minDeg: 190 },
        ['minDeg', 'scope'],
      ],
      ['batches', { coatingId, lotCode: '', producedOn: '14/03/2026' }, ['lotCode', 'producedOn']],
      [
        'batches',
        { ...bodies.batch(coatingId), process: { cureTemperatureC: 900, ovenColour: 'red' } },
        ['process', 'process.cureTemperatureC'],
      ],
      ['samples', { batchId: '', label: '' }, ['batchId', 'label']],
      [
        'probeLiquids',
        { name: 'Odd', totalMnM: 50, dispersiveMnM: 30, polarMnM: 30 },
        ['polarMnM'],
      ],
      [
        'measurementSessions',
        {
          ...bodies.measurementSession(),
          temperatureC: 80,
          humidityPct: -1,
          dropVolumeUl: 0,
          scalePxPerMm: 0,
        },
        ['dropVolumeUl', 'humidityPct', 'scalePxPerMm', 'temperatureC'],
      ],
    ];
    for (const [name, body, fields] of cases) {
      const response = await api.create(resources[name], { sessionId: admin, body });
      expect(response.status, `${name} ${JSON.stringify(body)}`).toBe(400);
      expect(response.body.error.code).toBe('invalid_input');
      expect(Object.keys(response.body.error.fields).sort(), name).toEqual(fields);
    }
    expect(await auditSince(lab.id, mark)).toEqual([]);
  });

  it('messages say what to enter', async () => {
    const response = await api.create(resources.batches, { sessionId: admin, body: { coatingId } });
    expect(response.body.error.fields.lotCode).toBe('Enter a lot code, like B-0412.');
    expect(response.body.error.fields.producedOn).toMatch(/YYYY-MM-DD/);
  });

  it('a body that is not JSON gets 400 invalid_json', async () => {
    const { POST } = resources.coatings.collection;
    const request = new Request(`${APP_ORIGIN}/api/coatings`, {
      method: 'POST',
      headers: {
        origin: APP_ORIGIN,
        host: new URL(APP_ORIGIN).host,
        cookie: `beadline_session=${admin}`,
        'content-type': 'application/json',
      },
      body: '{ not json',
    });
    const response = await POST(request, { params: Promise.resolve({ id: '' }) });
    expect(response.status).toBe(400);
    expect((await response.json()).error.code).toBe('invalid_json');
  });

  it('spec limits are checked on the merged record of a partial update', async () => {
    const spec = (
      await api.create(resources.specs, {
        sessionId: admin,
        body: { ...bodies.spec(coatingId), minDeg: 100, maxDeg: 120 },
      })
    ).body.spec;
    const response = await api.update(resources.specs, spec.id, {
      sessionId: admin,
      body: { version: 1, minDeg: 130 },
    });
    expect(response.status).toBe(400);
    expect(response.body.error.fields.maxDeg).toMatch(/maximum angle/);
    const clearing = await api.update(resources.specs, spec.id, {
      sessionId: admin,
      body: { version: 1, minDeg: null, maxDeg: null },
    });
    expect(clearing.status).toBe(400);
    expect(clearing.body.error.fields.minDeg).toMatch(/at least one limit/);
    const ok = await api.update(resources.specs, spec.id, {
      sessionId: admin,
      body: { version: 1, maxDeg: null },
    });
    expect(ok.status).toBe(200);
    expect(ok.body.spec).toMatchObject({ minDeg: 100, maxDeg: null, version: 2 });
  });

  it('probe-liquid components are checked on the merged record', async () => {
    const liquid = (
      await api.create(resources.probeLiquids, { sessionId: admin, body: bodies.probeLiquid() })
    ).body.probeLiquid;
    const response = await api.update(resources.probeLiquids, liquid.id, {
      sessionId: admin,
      body: { version: 1, totalMnM: 60 },
    });
    expect(response.status).toBe(400);
    expect(response.body.error.fields.polarMnM).toMatch(/add up to the total/);
    const ok = await api.update(resources.probeLiquids, liquid.id, {
      sessionId: admin,
      body: { version: 1, totalMnM: 72.3 },
    });
    expect(ok.status).toBe(200);
  });

  it('a batch’s process parameters are replaced as a whole', async () => {
    const batch = (
      await api.create(resources.batches, { sessionId: admin, body: bodies.batch(coatingId) })
    ).body.batch;
    expect(batch.process).toEqual({ cureTemperatureC: 180, cureTimeMin: 20 });
    const response = await api.update(resources.batches, batch.id, {
      sessionId: admin,
      body: { version: 1, process: { lineSpeedMPerMin: '12.5' } },
    });
    expect(response.status).toBe(200);
    expect(response.body.batch.process).toEqual({ lineSpeedMPerMin: 12.5 });
  });

  it('organizationId in a body is ignored: records land in the caller’s organization', async () => {
    const other = await createLab();
    const response = await api.create(resources.coatings, {
      sessionId: admin,
      body: { ...bodies.coating(), organizationId: other.id },
    });
    expect(response.status).toBe(201);
    expect(response.body.coating.organizationId).toBe(lab.id);
  });
});

describe('built-in probe-liquid library', () => {
  it('holds the five liquids with stable ids and the published values (Ström et al. 1987; van Oss et al. 1988)', async () => {
    const rows = await getDb()
      .select()
      .from(probeLiquids)
      .where(isNull(probeLiquids.organizationId));
    const byId = new Map(rows.map((row) => [row.id, row]));
    const expected: Record<string, [number, number, number, number, number, number, number]> = {
      // total, dispersive, polar, LW, γ+, γ−, density (g/cm³, 20 °C) — values as published
      'liquid-water': [72.8, 21.8, 51.0, 21.8, 25.5, 25.5, 0.998],
      'liquid-diiodomethane': [50.8, 50.8, 0, 50.8, 0, 0, 3.325],
      'liquid-ethylene-glycol': [48.0, 29.0, 19.0, 29.0, 1.92, 47.0, 1.113],
      'liquid-formamide': [58.0, 39.0, 19.0, 39.0, 2.28, 39.6, 1.133],
      'liquid-glycerol': [64.0, 34.0, 30.0, 34.0, 3.92, 57.4, 1.261],
    };
    for (const [id, values] of Object.entries(expected)) {
      const row = byId.get(id);
      expect(row, id).toBeDefined();
      expect([
        row!.totalMnM,
        row!.dispersiveMnM,
        row!.polarMnM,
        row!.lifshitzVanDerWaalsMnM,
        row!.acidMnM,
        row!.baseMnM,
        row!.densityGPerCm3,
      ]).toEqual(values);
      // Issue 14: each value names a published work a lab can look up (title, year, pages, table),
      // not a figure "as commonly cited" or "from memory".
      expect(row!.sources.total).toMatch(
        /^Ström, Fredriksson & Stenius, “Contact angles, .*”, J\. Colloid Interface Sci\. 119 \(1987\) 352–361, table /,
      );
      expect(row!.sources.acid).toMatch(
        /^van Oss, Chaudhury & Good, “Interfacial Lifshitz–van der Waals .*”, Chem\. Rev\. 88 \(1988\) 927–941, table /,
      );
      for (const source of Object.values(row!.sources)) {
        expect(source).not.toMatch(/commonly cited|from memory/);
      }
    }
    for (const id of ['liquid-diiodomethane', 'liquid-formamide', 'liquid-ethylene-glycol']) {
      expect(byId.get(id)!.hazardNote).toMatch(/Harmful.*safety data sheet/);
    }
    expect(byId.get('liquid-water')!.hazardNote).toBeNull();
  });

  it('a second run inserts nothing and leaves the rows as they are', async () => {
    const before = await getDb()
      .select()
      .from(probeLiquids)
      .where(eq(probeLiquids.id, 'liquid-water'));
    expect(await ensureProbeLiquidLibrary(getDb())).toEqual([]);
    const after = await getDb()
      .select()
      .from(probeLiquids)
      .where(eq(probeLiquids.id, 'liquid-water'));
    expect(after).toEqual(before);
    expect(PROBE_LIQUID_LIBRARY).toHaveLength(5);
  });
});
