/** CSV import of hand-read angles: all or nothing, every problem named by row and column. */
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { analyses, auditEvents, drops } from '@/db/schema';
import * as importRoute from '@/app/api/batches/[id]/import/route';
import { SOFTWARE_VERSION } from '@/lib/measure/version';
import { apiRequest } from '../support/request';
import { bodies, created, labWithBatch, resources, unique, type Lab } from '../records/helpers';

let lab: Lab;
let analyst: string;
let batchId: string;
let otherBatchId: string;

beforeAll(async () => {
  let coatingId: string;
  ({ lab, analyst, coatingId, batchId } = await labWithBatch());
  otherBatchId = await created(resources.batches, analyst, bodies.batch(coatingId));
  for (const label of ['P-01', 'P-02']) {
    await created(resources.samples, analyst, bodies.sample(batchId, label));
  }
  await created(resources.samples, analyst, bodies.sample(otherBatchId, 'Q-01'));
});

afterAll(async () => {
  await closeDb();
});

async function importCsv(id: string, csv: string, sessionId = analyst) {
  const response = await importRoute.POST(
    apiRequest(`/api/batches/${id}/import`, { method: 'POST', sessionId, body: { csv } }),
    { params: Promise.resolve({ id }) },
  );
  return { status: response.status, body: await response.json() };
}

/** Every drop of the test organization (it has no other batches with drops). */
const labDrops = () =>
  getDb().select({ id: drops.id }).from(drops).where(eq(drops.organizationId, lab.id));

describe('POST /api/batches/[id]/import', () => {
  it('imports nothing when one row is wrong, and names every problem with row and column', async () => {
    const csv = [
      'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at,Operator,Note',
      'P-01,Water,104.2,103.8,2019-05-14 10:30,J. Doe,fine',
      'P-01,Water,190,103.8,2019-05-14,J. Doe,left too large',
      'P-09,Mercury,abc,,2019-13-40,,unknown sample and liquid',
      'Q-01,Water,100,100,2019-05-14,,sample of another batch',
    ].join('\n');
    const response = await importCsv(batchId, csv);
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_rows');
    const issues = response.body.issues as { row: number; column: string; message: string }[];
    const at = (row: number) =>
      issues.filter((issue) => issue.row === row).map((issue) => issue.column);
    expect(at(2)).toEqual([]);
    expect(at(3)).toEqual(['Left angle (°)']);
    // Row 4: the shape errors first (sample and liquid are only looked up once every row parses).
    expect(at(4)).toEqual(['Left angle (°)', 'Right angle (°)', 'Measured at']);
    expect(issues.find((issue) => issue.row === 3)!.message).toMatch(/0 to 180/);
    expect(await labDrops()).toHaveLength(0);
  });

  it('checks the references of well-formed rows: unknown sample, sample of another batch, unknown liquid', async () => {
    const csv = [
      'Sample label;Probe liquid;Left angle (°);Right angle (°);Measured at',
      'P-09;Water;100;101;2019-05-14',
      'Q-01;Water;100;101;2019-05-14',
      'P-01;Mercury;100;101;2019-05-14',
    ].join('\n');
    const response = await importCsv(batchId, csv);
    expect(response.status).toBe(400);
    expect(response.body.issues).toEqual([
      { row: 2, column: 'Sample label', message: expect.stringMatching(/No sample "P-09"/) },
      { row: 3, column: 'Sample label', message: expect.stringMatching(/No sample "Q-01"/) },
      {
        row: 4,
        column: 'Probe liquid',
        message: expect.stringMatching(/No probe liquid "Mercury"/),
      },
    ]);
    expect(await labDrops()).toHaveLength(0);
  });

  it('names a missing header column and an empty file', async () => {
    const missing = await importCsv(
      batchId,
      'Sample label,Left angle (°),Right angle (°)\nP-01,1,2\n',
    );
    expect(missing.status).toBe(400);
    expect(missing.body.issues.map((i: { column: string }) => i.column)).toEqual([
      'Probe liquid',
      'Measured at',
    ]);
    expect(missing.body.issues.every((i: { row: number }) => i.row === 1)).toBe(true);
    const empty = await importCsv(
      batchId,
      'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at\n',
    );
    expect(empty.status).toBe(400);
    expect(empty.body.issues[0].message).toMatch(/no rows/);
  });

  it('imports every row of a valid file as drops with one manual analysis each, and one audit row', async () => {
    const csv = [
      '\uFEFFSample label,Probe liquid,Left angle (°),Right angle (°),Measured at,Operator,Note',
      'P-01,Water,104.2,103.8,2019-05-14 10:30,J. Doe,notebook 7',
      'p-02,liquid-diiodomethane,60.5,61.5,2019-05-15T08:00:00+02:00,,',
    ].join('\r\n');
    const response = await importCsv(batchId, csv);
    expect(response.status).toBe(201);
    expect(response.body.imported).toBe(2);
    const rows = await getDb()
      .select()
      .from(drops)
      .innerJoin(analyses, eq(analyses.dropId, drops.id))
      .where(eq(drops.organizationId, lab.id));
    expect(rows).toHaveLength(2);
    for (const { drops: drop, analyses: analysis } of rows) {
      expect(drop.source).toBe('import');
      expect(drop.photoId).toBeNull();
      expect(analysis.method).toBe('manual');
      expect(analysis.revision).toBe(1);
      expect(analysis.baseline).toBeNull();
      expect(analysis.leftUncertaintyDeg).toBeNull();
      expect(analysis.rightUncertaintyDeg).toBeNull();
      expect(analysis.softwareVersion).toBe(SOFTWARE_VERSION);
      expect(analysis.meanDeg).toBeCloseTo((analysis.leftDeg + analysis.rightDeg) / 2, 10);
    }
    const water = rows.find((row) => row.drops.probeLiquidId === 'liquid-water')!;
    expect(water.analyses.result).toMatchObject({
      leftDeg: 104.2,
      rightDeg: 103.8,
      meanDeg: 104,
      operator: 'J. Doe',
    });
    expect(water.drops.measuredAt.toISOString()).toBe('2019-05-14T10:30:00.000Z');
    const diiodo = rows.find((row) => row.drops.probeLiquidId === 'liquid-diiodomethane')!;
    expect(diiodo.drops.measuredAt.toISOString()).toBe('2019-05-15T06:00:00.000Z');
    const audit = await getDb()
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.organizationId, lab.id), eq(auditEvents.action, 'drop.import')));
    expect(audit).toHaveLength(1);
    expect(audit[0].entityId).toBe(batchId);
  });

  it('shows the imported drops on the batch: drop count and mean water angle per sample', async () => {
    const { listSamplesWithResults } = await import('@/db/queries/sample-results');
    const { sampleListQuerySchema } = await import('@/lib/contracts/samples');
    const page = await listSamplesWithResults(lab.id, sampleListQuerySchema.parse({ batchId }), 'all');
    const byLabel = Object.fromEntries(page.items.map((item) => [item.label, item]));
    expect(byLabel['P-01']).toMatchObject({ dropCount: 1, waterDropCount: 1, meanWaterDeg: 104 });
    expect(byLabel['P-02']).toMatchObject({ dropCount: 1, waterDropCount: 0, meanWaterDeg: null });
  });

  it('is for analysts and admins: reviewers and viewers get 403, and nothing is imported', async () => {
    const csv =
      'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at\nP-01,Water,90,91,2019-05-14\n';
    for (const role of ['reviewer', 'viewer'] as const) {
      const response = await importCsv(batchId, csv, lab.members[role].sessionId);
      expect(response.status).toBe(403);
    }
    const other = await importCsv(unique('missing'), csv);
    expect(other.status).toBe(404);
  });
});
