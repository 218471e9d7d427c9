/** Tensiometry route handlers: Wilhelmy plate and the water probe check, computed and saved. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import * as wilhelmyRoute from '@/app/api/tensiometry/wilhelmy/route';
import * as waterRoute from '@/app/api/tensiometry/water-check/route';
import * as listRoute from '@/app/api/tensiometry/route';
import * as pendantRoute from '@/app/api/tensiometry/pendant-drop/route';
import { integrateYoungLaplace } from '@/lib/analysis/young-laplace-profile';
import { createLab, type Lab } from '../records/helpers';
import { call } from './helpers';

let lab: Lab;

beforeAll(async () => {
  lab = await createLab();
});

afterAll(async () => {
  await closeDb();
});

const plate = { plateWidthMm: 19.62, plateThicknessMm: 0.1 };

/** POST /api/tensiometry/wilhelmy as the lab's analyst. */
const wilhelmy = (body: Record<string, unknown>) =>
  call(wilhelmyRoute.POST, '/api/tensiometry/wilhelmy', {
    method: 'POST',
    sessionId: lab.members.analyst.sessionId,
    body,
  });

describe('POST /api/tensiometry/water-check', () => {
  it('compares with IAPWS R1-76(2014) and flags contamination', async () => {
    const ok = await call(waterRoute.POST, '/api/tensiometry/water-check', {
      method: 'POST',
      sessionId: lab.members.viewer.sessionId,
      body: { measuredMilliNewtonPerM: 72.5, temperatureC: 20 },
    });
    expect(ok.status).toBe(200);
    // IAPWS R1-76(2014), table of values: 72.74 mN/m at 20 °C.
    expect(ok.body.result.referenceMilliNewtonPerM).toBeCloseTo(72.74, 2);
    expect(ok.body.result.flag).toBe('within-tolerance');
    const low = await call(waterRoute.POST, '/api/tensiometry/water-check', {
      method: 'POST',
      sessionId: lab.members.viewer.sessionId,
      body: { measuredMilliNewtonPerM: 70.2, temperatureC: 20, toleranceMilliNewtonPerM: 1 },
    });
    expect(low.body.result.flag).toBe('low-likely-contamination');
  });

  it('names the bad fields', async () => {
    const response = await call(waterRoute.POST, '/api/tensiometry/water-check', {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: { measuredMilliNewtonPerM: -3, temperatureC: 500 },
    });
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields).sort()).toEqual([
      'measuredMilliNewtonPerM',
      'temperatureC',
    ]);
  });

  it('saves with its inputs for analysts, not for viewers', async () => {
    const body = { measuredMilliNewtonPerM: 72.1, temperatureC: 23.5, save: true };
    const refused = await call(waterRoute.POST, '/api/tensiometry/water-check', {
      method: 'POST',
      sessionId: lab.members.viewer.sessionId,
      body,
    });
    expect(refused.status).toBe(403);
    const saved = await call(waterRoute.POST, '/api/tensiometry/water-check', {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body,
    });
    expect(saved.status).toBe(201);
    const list = await call(waterRoute.GET, '/api/tensiometry/water-check', {
      sessionId: lab.members.viewer.sessionId,
    });
    const item = list.body.items.find((i: { id: string }) => i.id === saved.body.saved.id);
    expect(item.inputs).toEqual({
      measuredMilliNewtonPerM: 72.1,
      temperatureC: 23.5,
      toleranceMilliNewtonPerM: 1,
    });
    expect(item.outputs.referenceMilliNewtonPerM).toBeCloseTo(
      saved.body.result.referenceMilliNewtonPerM,
      12,
    );
  });
});

describe('POST /api/tensiometry/wilhelmy', () => {
  it('gives the surface tension with θ = 0 and the buoyancy correction', async () => {
    // Forward model by hand (Wilhelmy 1863): F = γ·2(w + t) − ρ g w t d
    // = 72.74e-3 · 2(19.72e-3) N − 998 · 9.80665 · 19.62e-3 · 0.1e-3 · 2e-3 N.
    const buoyancy = 998 * 9.80665 * 19.62e-3 * 0.1e-3 * 2e-3 * 1000;
    const force = 72.74 * 2 * (19.62 + 0.1) * 1e-3 - buoyancy;
    const response = await wilhelmy({
      mode: 'tension',
      ...plate,
      forceMilliNewton: force,
      immersionDepthMm: 2,
      liquidDensityGPerCm3: 0.998,
    });
    expect(response.status).toBe(200);
    expect(response.body.result.surfaceTensionMilliNewtonPerM).toBeCloseTo(72.74, 8);
    expect(response.body.result.buoyancyMilliNewton).toBeCloseTo(buoyancy, 10);
  });

  it('gives the contact angle for a liquid of known tension', async () => {
    const force = 72.8 * 2 * (19.62 + 0.1) * 1e-3 * Math.cos((60 * Math.PI) / 180);
    const response = await wilhelmy({
      mode: 'angle',
      ...plate,
      forceMilliNewton: force,
      liquidSurfaceTensionMilliNewtonPerM: 72.8,
      save: true,
    });
    expect(response.status).toBe(201);
    expect(response.body.result.contactAngleDeg).toBeCloseTo(60, 8);
    const list = await call(listRoute.GET, '/api/tensiometry?kind=wilhelmy-angle', {
      sessionId: lab.members.viewer.sessionId,
    });
    expect(list.body.items[0].id).toBe(response.body.saved.id);
    expect(list.body.items[0].inputs.mode).toBe('angle');
  });

  it('asks for the density when the plate is immersed, and names bad fields', async () => {
    const missing = await wilhelmy({
      mode: 'tension',
      ...plate,
      forceMilliNewton: 2.8,
      immersionDepthMm: 2,
    });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields.liquidDensityGPerCm3).toMatch(/density/);
    const bad = await wilhelmy({
      mode: 'tension',
      plateWidthMm: 0,
      plateThicknessMm: 0.1,
      forceMilliNewton: 'x',
    });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['forceMilliNewton', 'plateWidthMm']);
  });

  it('explains a force no angle can explain', async () => {
    const response = await wilhelmy({
      mode: 'angle',
      ...plate,
      forceMilliNewton: 50,
      liquidSurfaceTensionMilliNewtonPerM: 72.8,
    });
    expect(response.status).toBe(422);
    expect(response.body.error.fields.forceMilliNewton).toMatch(/cos θ/);
  });
});

describe('POST /api/tensiometry/pendant-drop', () => {
  /** Edge of a hanging water drop rendered from the Young–Laplace equation at γ = 72.0 mN/m. */
  function edge() {
    const b = 1.35e-3;
    const beta = (997 * 9.80665 * b * b) / 0.072;
    const profile = integrateYoungLaplace(-beta, { maxZ: 6, step: 0.0005 });
    const bPx = 1.35 * 120;
    const points: { x: number; y: number }[] = [];
    let xmax = 0;
    for (let k = 1; k < profile.n; k += 40) {
      xmax = Math.max(xmax, profile.x[k]);
      if (profile.phi[k] > Math.PI / 2 && profile.x[k] < 0.6 * xmax) break;
      for (const side of [1, -1])
        points.push({ x: 400 + side * profile.x[k] * bPx, y: 600 - profile.z[k] * bPx });
    }
    return points;
  }

  it('fits γ within 0.5 % and stores it with its inputs', async () => {
    const response = await call(pendantRoute.POST, '/api/tensiometry/pendant-drop', {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: {
        edge: edge(),
        needleOuterDiameterMm: 1.2,
        needleOuterDiameterPx: 144,
        densityDifferenceKgPerM3: 997,
        save: true,
      },
    });
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    expect(Math.abs(response.body.result.surfaceTensionMilliNewtonPerM - 72) / 72).toBeLessThan(
      0.005,
    );
    expect(response.body.saved.kind).toBe('pendant-drop');
  });

  it('names missing fields', async () => {
    const response = await call(pendantRoute.POST, '/api/tensiometry/pendant-drop', {
      method: 'POST',
      sessionId: lab.members.analyst.sessionId,
      body: { edge: [{ x: 1, y: 2 }] },
    });
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields).sort()).toEqual([
      'densityDifferenceKgPerM3',
      'edge',
      'needleOuterDiameterMm',
      'needleOuterDiameterPx',
    ]);
  });
});
