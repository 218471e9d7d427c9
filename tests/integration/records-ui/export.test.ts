/** CSV exports of the record tables: header with units, the list's filter over all pages, formula-injection guard, who may export. */
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import * as batchesExport from '@/app/api/batches/export.csv/route';
import * as coatingsExport from '@/app/api/coatings/export.csv/route';
import * as liquidsExport from '@/app/api/probe-liquids/export.csv/route';
import * as samplesExport from '@/app/api/samples/export.csv/route';
import * as sessionsExport from '@/app/api/measurement-sessions/export.csv/route';
import * as specsExport from '@/app/api/specs/export.csv/route';
import * as importRoute from '@/app/api/batches/[id]/import/route';
import { safeCell } from '@/lib/csv';
import { apiRequest } from '../support/request';
import {
  api,
  bodies,
  createLab,
  ensureLibrary,
  resources,
  unique,
  type Lab,
} from '../records/helpers';

type Handler = (request: Request, context: unknown) => Promise<Response>;

let lab: Lab;
let admin: string;
let coatingA: string;
let coatingB: string;
let batchA1: string;
const prefix = unique('EXP');

async function exportCsv(handler: Handler, path: string, sessionId: string) {
  const response = await handler(apiRequest(path, { sessionId }), { params: Promise.resolve({}) });
  const bytes = new Uint8Array(await response.arrayBuffer());
  const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  return { status: response.status, headers: response.headers, text, bytes };
}

const table = (text: string) => parse(text, { bom: true }) as string[][];

beforeAll(async () => {
  await ensureLibrary();
  lab = await createLab();
  admin = lab.members.admin.sessionId;
  coatingA = (
    await api.create(resources.coatings, { sessionId: admin, body: bodies.coating(`${prefix}-A`) })
  ).body.coating.id;
  coatingB = (
    await api.create(resources.coatings, {
      sessionId: admin,
      body: {
        ...bodies.coating(`${prefix}-B`),
        description: '=HYPERLINK("http://evil.example","click")',
      },
    })
  ).body.coating.id;
  // 205 batches of A (more than one export page of 200) and 2 of B.
  for (let n = 1; n <= 205; n++) {
    const body = {
      ...bodies.batch(coatingA, `${prefix}-A${String(n).padStart(3, '0')}`),
      producedOn: `2026-0${1 + (n % 3)}-1${n % 10}`,
      process: { cureTemperatureC: 150 + (n % 7), cureTimeMin: 20 },
      notes: n === 1 ? '+SUM(A1:A9)' : n === 2 ? '-2+3' : n === 3 ? '@cmd' : 'ok',
    };
    const created = await api.create(resources.batches, { sessionId: admin, body });
    expect(created.status).toBe(201);
    if (n === 1) batchA1 = created.body.batch.id;
  }
  for (let n = 1; n <= 2; n++) {
    await api.create(resources.batches, {
      sessionId: admin,
      body: bodies.batch(coatingB, `${prefix}-B${n}`),
    });
  }
  await api.create(resources.samples, { sessionId: admin, body: bodies.sample(batchA1, 'P-01') });
  await api.create(resources.specs, { sessionId: admin, body: bodies.spec(coatingA) });
  await api.create(resources.measurementSessions, {
    sessionId: admin,
    body: bodies.measurementSession(),
  });
  const csv =
    'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at\nP-01,Water,100,102,2020-01-02\nP-01,Water,110,112,2020-01-02\n';
  const imported = await importRoute.POST(
    apiRequest(`/api/batches/${batchA1}/import`, {
      method: 'POST',
      sessionId: admin,
      body: { csv },
    }),
    { params: Promise.resolve({ id: batchA1 }) },
  );
  expect(imported.status).toBe(201);
}, 120_000);

afterAll(async () => {
  await closeDb();
});

describe('GET /api/batches/export.csv', () => {
  it('answers UTF-8 CSV with a header row naming units', async () => {
    const response = await exportCsv(
      batchesExport.GET as Handler,
      `/api/batches/export.csv?coatingId=${coatingB}`,
      admin,
    );
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(response.headers.get('content-disposition')).toMatch(
      /^attachment; filename="batches-\d{4}-\d{2}-\d{2}\.csv"$/,
    );
    // The UTF-8 byte-order mark, so spreadsheets read ° and µ right.
    expect([...response.bytes.slice(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const [header] = table(response.text);
    expect(header).toEqual(
      expect.arrayContaining([
        'Lot code',
        'Produced on',
        'Cure temperature (°C)',
        'Cure time (min)',
        'Coat weight (g/m²)',
      ]),
    );
  });

  it('holds every row of the filter, across all pages, in the list sort', async () => {
    const response = await exportCsv(
      batchesExport.GET as Handler,
      `/api/batches/export.csv?coatingId=${coatingA}&sort=lotCode&dir=desc&page=3&pageSize=5`,
      admin,
    );
    const [header, ...rows] = table(response.text);
    expect(rows).toHaveLength(205);
    const lot = header.indexOf('Lot code');
    expect(rows[0][lot]).toBe(`${prefix}-A205`);
    expect(rows.at(-1)![lot]).toBe(`${prefix}-A001`);
    expect(rows.every((row) => row[lot].startsWith(`${prefix}-A`))).toBe(true);
    const range = await exportCsv(
      batchesExport.GET as Handler,
      `/api/batches/export.csv?coatingId=${coatingA}&producedFrom=2026-02-01&producedTo=2026-02-28`,
      admin,
    );
    const produced = table(range.text)[0].indexOf('Produced on');
    const inRange = table(range.text).slice(1);
    expect(inRange.length).toBeGreaterThan(0);
    expect(inRange.every((row) => row[produced].startsWith('2026-02-'))).toBe(true);
    const list = await api.list(resources.batches, {
      sessionId: admin,
      query: `coatingId=${coatingA}&producedFrom=2026-02-01&producedTo=2026-02-28`,
    });
    expect(inRange).toHaveLength(list.body.total);
  });

  it('defuses cells a spreadsheet would run as formulas, and keeps numbers numeric', async () => {
    const response = await exportCsv(
      batchesExport.GET as Handler,
      `/api/batches/export.csv?q=${prefix}-A00&sort=lotCode&dir=asc`,
      admin,
    );
    const [header, ...rows] = table(response.text);
    const notes = header.indexOf('Notes');
    expect(rows[0][notes]).toBe("'+SUM(A1:A9)");
    expect(rows[1][notes]).toBe("'-2+3");
    expect(rows[2][notes]).toBe("'@cmd");
    expect(rows[0][header.indexOf('Cure temperature (°C)')]).toBe('151');
    const coatings = await exportCsv(
      coatingsExport.GET as Handler,
      `/api/coatings/export.csv?q=${prefix}-B`,
      admin,
    );
    const [coatingHeader, coatingRow] = table(coatings.text);
    expect(coatingRow[coatingHeader.indexOf('Description')]).toBe(
      '\'=HYPERLINK("http://evil.example","click")',
    );
    expect(safeCell(-3.5)).toBe(-3.5);
    expect(safeCell('\tx')).toBe("'\tx");
  });

  it('refuses viewers (403) and lets reviewers export', async () => {
    const viewer = await exportCsv(
      batchesExport.GET as Handler,
      '/api/batches/export.csv',
      lab.members.viewer.sessionId,
    );
    expect(viewer.status).toBe(403);
    expect(JSON.parse(viewer.text).error.code).toBe('forbidden');
    const reviewer = await exportCsv(
      batchesExport.GET as Handler,
      '/api/batches/export.csv',
      lab.members.reviewer.sessionId,
    );
    expect(reviewer.status).toBe(200);
    const signedOut = await exportCsv(batchesExport.GET as Handler, '/api/batches/export.csv', '');
    expect(signedOut.status).toBe(401);
  });

  it('answers 400 with the field for a bad filter', async () => {
    const response = await exportCsv(
      batchesExport.GET as Handler,
      '/api/batches/export.csv?producedFrom=yesterday',
      admin,
    );
    expect(response.status).toBe(400);
    expect(JSON.parse(response.text).error.fields.producedFrom).toBeTruthy();
  });
});

describe('the other exports', () => {
  it('samples: drop counts and the mean water angle of the imported drops', async () => {
    const response = await exportCsv(
      samplesExport.GET as Handler,
      `/api/samples/export.csv?batchId=${batchA1}`,
      admin,
    );
    expect(response.status).toBe(200);
    const [header, row] = table(response.text);
    expect(header).toEqual(
      expect.arrayContaining(['Time since treatment (days)', 'Mean water contact angle (°)']),
    );
    expect(row[header.indexOf('Sample label')]).toBe('P-01');
    expect(row[header.indexOf('Drops')]).toBe('2');
    expect(Number(row[header.indexOf('Mean water contact angle (°)')])).toBe(106);
  });

  it('specs, probe liquids and sessions carry units in their headers', async () => {
    const specs = table(
      (
        await exportCsv(
          specsExport.GET as Handler,
          `/api/specs/export.csv?coatingId=${coatingA}`,
          admin,
        )
      ).text,
    );
    expect(specs[0]).toEqual(
      expect.arrayContaining(['Min contact angle (°)', 'Max surface energy (mN/m)']),
    );
    expect(specs).toHaveLength(2);
    const liquids = table(
      (await exportCsv(liquidsExport.GET as Handler, '/api/probe-liquids/export.csv', admin)).text,
    );
    expect(liquids[0]).toEqual(
      expect.arrayContaining([
        'Total surface tension (mN/m)',
        'Density (g/cm³)',
        'Sources',
        'Hazard note',
      ]),
    );
    const water = liquids.find((row) => row[0] === 'Water')!;
    expect(Number(water[liquids[0].indexOf('Total surface tension (mN/m)')])).toBeCloseTo(72.8, 1);
    const sessions = table(
      (
        await exportCsv(
          sessionsExport.GET as Handler,
          '/api/measurement-sessions/export.csv',
          admin,
        )
      ).text,
    );
    expect(sessions[0]).toEqual(
      expect.arrayContaining(['Temperature (°C)', 'Relative humidity (%)', 'Drop volume (µL)']),
    );
    expect(sessions).toHaveLength(2);
  });
});
