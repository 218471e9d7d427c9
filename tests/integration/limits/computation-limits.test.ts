/**
 * Size limits of the computation inputs (issue 12, failure 8): a too-large input is refused with
 * the documented error body `{ error: { code, message, fields? } }` before any computation runs,
 * and nothing is stored.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import * as importRoute from '@/app/api/batches/[id]/import/route';
import * as pendantRoute from '@/app/api/tensiometry/pendant-drop/route';
import * as calculateRoute from '@/app/api/surface-energy/calculate/route';
import {
  IMPORT_TOO_LONG,
  MAX_IMPORT_CHARS,
  MAX_IMPORT_ROWS,
  MAX_PENDANT_EDGE_POINTS,
  MAX_SURFACE_ENERGY_LIQUIDS,
  PENDANT_EDGE_TOO_LONG,
  TOO_MANY_IMPORT_ROWS,
  TOO_MANY_LIQUIDS,
} from '@/lib/contracts/limits';
import { apiRequest } from '../support/request';
import { bodies, created, labWithBatch, resources, type Lab } from '../records/helpers';
import { call, idParams } from '../surface-energy/helpers';

let lab: Lab;
let analyst: string;
let batchId: string;

beforeAll(async () => {
  ({ lab, analyst, batchId } = await labWithBatch());
  await created(resources.samples, analyst, bodies.sample(batchId, 'L-01'));
});

afterAll(async () => {
  await closeDb();
});

function expectErrorBody(body: unknown, code: string) {
  expect(body).toMatchObject({ error: { code, message: expect.any(String) } });
}

/** A half circle of `count` points, 200 px across (a plausible outline, only too long). */
const outline = (count: number) =>
  Array.from({ length: count }, (_, i) => {
    const t = (Math.PI * i) / (count - 1);
    return { x: 300 + 100 * Math.cos(t), y: 200 + 100 * Math.sin(t) };
  });

const pendantBody = (edge: unknown) => ({
  edge,
  needleOuterDiameterMm: 0.72,
  needleOuterDiameterPx: 60,
  densityDifferenceKgPerM3: 997,
});

describe('pendant-drop outline', () => {
  it(`takes at most ${MAX_PENDANT_EDGE_POINTS} points and says how to send fewer`, async () => {
    const response = await call(pendantRoute.POST, '/api/tensiometry/pendant-drop', {
      method: 'POST',
      sessionId: lab.members.viewer.sessionId,
      body: pendantBody(outline(MAX_PENDANT_EDGE_POINTS + 1)),
    });
    expect(response.status).toBe(400);
    expectErrorBody(response.body, 'invalid_input');
    expect(response.body.error.fields.edge).toBe(PENDANT_EDGE_TOO_LONG);
  });

  it('refuses a body over the route limit with 413 before parsing it', async () => {
    const padding = 'x'.repeat(3 * 1024 * 1024);
    const response = await call(pendantRoute.POST, '/api/tensiometry/pendant-drop', {
      method: 'POST',
      sessionId: lab.members.viewer.sessionId,
      body: { ...pendantBody(outline(100)), padding },
    });
    expect(response.status).toBe(413);
    expectErrorBody(response.body, 'payload_too_large');
  });
});

describe('surface-energy calculation', () => {
  it(`takes at most ${MAX_SURFACE_ENERGY_LIQUIDS} liquids`, async () => {
    const liquids = Array.from({ length: MAX_SURFACE_ENERGY_LIQUIDS + 1 }, (_, i) => ({
      name: `Liquid ${i + 1}`,
      gammaTotal: 50,
      gammaDispersive: 30,
      gammaPolar: 20,
      angleDeg: 40 + i,
    }));
    const response = await call(calculateRoute.POST, '/api/surface-energy/calculate', {
      method: 'POST',
      sessionId: lab.members.viewer.sessionId,
      body: { liquids },
    });
    expect(response.status).toBe(400);
    expectErrorBody(response.body, 'invalid_input');
    expect(response.body.error.fields.liquids).toBe(TOO_MANY_LIQUIDS);
  });
});

describe('CSV import', () => {
  async function importCsv(csv: string) {
    const response = await importRoute.POST(
      apiRequest(`/api/batches/${batchId}/import`, {
        method: 'POST',
        sessionId: analyst,
        body: { csv },
      }),
      idParams(batchId),
    );
    return { status: response.status, body: await response.json() };
  }
  const header = 'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at\n';

  it(`takes at most ${MAX_IMPORT_ROWS} rows, all or nothing`, async () => {
    const row = 'L-01,Water,100,101,2024-01-02 10:00\n';
    const response = await importCsv(header + row.repeat(MAX_IMPORT_ROWS + 1));
    expect(response.status).toBe(400);
    expectErrorBody(response.body, 'invalid_rows');
    expect(response.body.issues).toEqual([
      expect.objectContaining({ row: MAX_IMPORT_ROWS + 2, message: TOO_MANY_IMPORT_ROWS }),
    ]);
  });

  it(`takes at most ${MAX_IMPORT_CHARS} characters`, async () => {
    const response = await importCsv(header + 'x'.repeat(MAX_IMPORT_CHARS));
    expect(response.status).toBe(400);
    expectErrorBody(response.body, 'invalid_input');
    expect(response.body.error.fields.csv).toBe(IMPORT_TOO_LONG);
  });
});
