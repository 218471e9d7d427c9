import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { closeDb, getDb } from '@/db/client';
import { ensureProbeLiquidLibrary } from '@/db/probe-liquid-library';
import { auditEvents } from '@/db/schema';
import { POST as importCsv } from '@/app/api/batches/[id]/import/route';
import { PUT as watch } from '@/app/api/coatings/[id]/watch/route';
import { closeMailQueue } from '@/server/mail/queue';
import { apiRequest } from '../support/request';
import { createMember, createOrganization } from '../support/fixtures';
import { mailJobsTo } from '../team/support';
import { insertBatch, insertCoating, insertSample, insertWaterSpec } from '../support/seed';

type Member = Awaited<ReturnType<typeof createMember>>;
let admin: Member;
let analyst: Member;
let coatingId: string;
let batchId: string;

beforeAll(async () => {
  await ensureProbeLiquidLibrary(getDb());
  const lab = await createOrganization();
  admin = await createMember(lab.id, 'admin');
  analyst = await createMember(lab.id, 'analyst');
  coatingId = await insertCoating(lab.id, 'AL-1', 'Alert test coat');
  await insertWaterSpec(lab.id, coatingId, 100);
  batchId = await insertBatch(lab.id, coatingId, 'AL-B1', '2026-11-20');
  await insertSample(lab.id, batchId, 'S1');
});

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

const importAngles = async (angles: number[]) => {
  const csv = [
    'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at,Operator,Note',
    ...angles.map(
      (a, i) => `S1,Water,${a},${a},2026-11-21 10:${String(10 + i).padStart(2, '0')},T. Test,`,
    ),
  ].join('\n');
  const response = await importCsv(
    apiRequest(`/api/batches/${batchId}/import`, {
      method: 'POST',
      sessionId: analyst.sessionId,
      body: { csv },
    }),
    { params: Promise.resolve({ id: batchId }) },
  );
  expect(response.status).toBe(201);
};

const alertsToAdmin = async () =>
  (await mailJobsTo(admin.email)).filter((m) => m.data.kind === 'out-of-spec');

describe('out-of-spec alert', () => {
  it('mails the coating’s watchers once when a batch turns to fail, not again while it stays failed', async () => {
    const watched = await watch(
      apiRequest(`/api/coatings/${coatingId}/watch`, { method: 'PUT', sessionId: admin.sessionId }),
      { params: Promise.resolve({ id: coatingId }) },
    );
    expect(watched.status).toBe(200);

    await importAngles([110, 111, 109]);
    expect(await alertsToAdmin()).toHaveLength(0);

    await importAngles([95]);
    const alerts = await alertsToAdmin();
    expect(alerts).toHaveLength(1);
    expect(alerts[0]!.data.subject).toBe('Out of spec: AL-1 batch AL-B1');
    expect(alerts[0]!.data.text).toMatch(/100°/);

    await importAngles([94]);
    expect(await alertsToAdmin()).toHaveLength(1);
    const audit = await getDb().select().from(auditEvents).where(eq(auditEvents.entityId, batchId));
    expect(audit.filter((a) => a.action === 'batch.out_of_spec')).toHaveLength(1);
    // The analyst does not watch the coating and gets nothing.
    expect(
      (await mailJobsTo(analyst.email)).filter((m) => m.data.kind === 'out-of-spec'),
    ).toHaveLength(0);
  });
});
