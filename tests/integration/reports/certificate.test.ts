/**
 * The certificate of analysis as an archival document: PDF/A-2b identification and tagged
 * structure read back with pdfjs-dist, the status stamp on every page, the measurement details,
 * and the stored certificate reused while the batch is unchanged (real PostgreSQL).
 */
import { eq } from 'drizzle-orm';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { newId } from '@/db/queries/ids';
import { decideIfSubmitted, insertReview } from '@/db/queries/reviews';
import {
  batches,
  certificates,
  dynamicAnalyses,
  dynamicMeasurements,
  measurementSessions,
  specs,
} from '@/db/schema';
import type { OrgContext } from '@/lib/auth/context';
import { closeMailQueue } from '@/server/mail/queue';
import { renderCertificate, certificateRequestOf } from '@/server/reports/batch-report';
import { buildCertificate, requestCertificate } from '@/server/reports/certificate';
import {
  api,
  bodies,
  createLab,
  ensureLibrary,
  resources,
  unique,
  type Lab,
} from '../records/helpers';
import {
  insertBatch,
  insertCoating,
  insertDrop,
  insertSample,
  insertWaterSpec,
} from '../support/seed';

let lab: Lab;
let batchId: string;
let ctx: OrgContext;

beforeAll(async () => {
  await ensureLibrary();
  lab = await createLab();
  const coatingId = await insertCoating(lab.id, unique('CERT'));
  await insertWaterSpec(lab.id, coatingId, 100);
  batchId = await insertBatch(lab.id, coatingId, unique('B'));
  const sampleId = await insertSample(lab.id, batchId, 'P1', new Date('2026-11-02T08:00:00Z'));
  const sessionId = newId();
  await getDb()
    .insert(measurementSessions)
    .values({
      id: sessionId,
      organizationId: lab.id,
      operatorName: 'Tomasz Weir',
      measuredAt: new Date('2026-11-03T09:00:00Z'),
      probeLiquidId: 'liquid-water',
      temperatureC: 22.5,
      humidityPct: 47,
      dropVolumeUl: 3,
      instrumentNotes: 'Bench goniometer 2',
      liquidLot: 'W-LOT-0915',
    });
  for (const [i, meanDeg] of [104, 106, 105].entries()) {
    await insertDrop(lab.id, sampleId, {
      sessionId,
      measuredAt: new Date(`2026-11-03T09:0${i}:00Z`),
      revisions: [{ meanDeg }],
    });
  }
  ctx = {
    user: { id: lab.members.analyst.userId, email: lab.members.analyst.email, name: 'Ana Lyst' },
    sessionId: 'test',
    organization: { id: lab.id, name: 'Certificate lab', role: 'analyst' },
    memberships: [],
  };
});

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

async function readPdf(bytes: Buffer) {
  const pdf = await getDocument({ data: new Uint8Array(bytes), verbosity: 0 }).promise;
  const pages: string[] = [];
  const trees: unknown[] = [];
  for (let i = 1; i <= pdf.numPages; i++) {
    const page = await pdf.getPage(i);
    const content = await page.getTextContent();
    pages.push(
      content.items
        .map((item) => ('str' in item ? item.str : ''))
        .join(' ')
        .replace(/\s+/g, ' '),
    );
    trees.push(await page.getStructTree());
  }
  return { pdf, pages, trees, text: pages.join('\n') };
}

/** The roles of a structure tree, depth first. */
function roles(node: unknown): string[] {
  if (!node || typeof node !== 'object') return [];
  const n = node as { role?: string; children?: unknown[] };
  return [...(n.role ? [n.role] : []), ...(n.children ?? []).flatMap(roles)];
}

describe('certificate of analysis (PDF/A-2b, tagged)', () => {
  it('declares PDF/A-2b in its XMP metadata and carries a structure tree (StructTreeRoot, MarkInfo Marked)', async () => {
    const { pdf } = await renderCertificate(certificateRequestOf(ctx), batchId);
    const { pdf: doc, trees } = await readPdf(pdf);
    const { metadata, info } = await doc.getMetadata();
    expect(metadata?.get('pdfaid:part')).toBe('2');
    expect(metadata?.get('pdfaid:conformance')).toBe('B');
    expect((info as { PDFFormatVersion?: string }).PDFFormatVersion).toBe('1.7');
    expect(await doc.getMarkInfo()).toMatchObject({ Marked: true });
    // pdfjs builds the tree from the catalog's StructTreeRoot; every page has one.
    const bytes = pdf.toString('latin1');
    expect(bytes).toContain('/Type /StructTreeRoot');
    for (const tree of trees) expect(tree).not.toBeNull();
    const all = trees.flatMap(roles);
    expect(all).toContain('Document');
    expect(all).toContain('H1');
    expect(all).toContain('H2');
    expect(all).toContain('P');
    // Fonts are embedded (PDF/A): a font program for every font, no standard-14 font.
    expect(bytes).toMatch(/\/FontFile2 \d+ 0 R/);
    expect(bytes).not.toContain('/BaseFont /Helvetica');
  });

  it('stamps every page of an unsigned certificate and shows who measured, when, how and with what', async () => {
    const { pdf } = await renderCertificate(certificateRequestOf(ctx), batchId);
    const { pages, text } = await readPdf(pdf);
    for (const page of pages) expect(page).toContain('DRAFT — NOT APPROVED');
    expect(text).toContain('3 of 3 results are not approved');
    expect(text).toContain('Tomasz Weir');
    expect(text).toContain('W-LOT-0915');
    expect(text).toContain('Bench goniometer 2');
    expect(text).toContain('22.5 °C, 47 % RH');
    expect(text).toMatch(/2026-11-03 09:00–\s?09:02/);
    expect(text).toContain('Read by hand');
    expect(text).toMatch(/Software: \S+/);
    // Proper symbols, not their ASCII spellings.
    expect(text).toContain('≥ 100°');
    expect(text).not.toContain('>=');
  });

  it('stamps every page REJECTED with the rejection comment after a rejected review', async () => {
    const db = getDb();
    const [batch] = await db.select().from(batches).where(eq(batches.id, batchId));
    const other = await insertBatch(lab.id, batch.coatingId, unique('B'));
    const sample = await insertSample(lab.id, other, 'P1');
    await insertDrop(lab.id, sample, { revisions: [{ meanDeg: 101, reviewStatus: 'rejected' }] });
    const reviewId = newId();
    await insertReview(db, {
      id: reviewId,
      organizationId: lab.id,
      scope: 'batch',
      batchId: other,
      sampleId: null,
      analysisIds: [],
      submittedByUserId: lab.members.analyst.userId,
      submitNote: '',
    });
    await decideIfSubmitted(db, reviewId, {
      status: 'rejected',
      decidedByUserId: lab.members.reviewer.userId,
      decidedAt: new Date('2026-11-04T10:00:00Z'),
      decisionComment: 'Repeat P1: drops look contaminated.',
      signature: null,
    });
    const { pages } = await readPdf(
      (await renderCertificate(certificateRequestOf(ctx), other)).pdf,
    );
    for (const page of pages) {
      expect(page).toContain('REJECTED');
      expect(page).toContain('Repeat P1: drops look contaminated.');
    }
  });

  it('is built once by the job and reused while the batch is unchanged; a change makes a new one', async () => {
    const stored = () =>
      getDb()
        .select({ id: certificates.id, fingerprint: certificates.fingerprint })
        .from(certificates)
        .where(eq(certificates.batchId, batchId));
    const first = await requestCertificate(ctx, batchId);
    expect(first.status).toBe('preparing');
    const request = certificateRequestOf(ctx);
    const fingerprint = await buildCertificate({ request, batchId });
    const ready = await requestCertificate(ctx, batchId);
    expect(ready.status).toBe('ready');
    expect(await stored()).toHaveLength(1);

    // Nothing changed: the same stored file, no new build.
    const again = await requestCertificate(ctx, batchId);
    expect(again.status).toBe('ready');
    if (again.status === 'ready' && ready.status === 'ready')
      expect(again.pdf.equals(ready.pdf)).toBe(true);
    expect(await buildCertificate({ request, batchId })).toBe(fingerprint);
    expect(await stored()).toHaveLength(1);

    // A change to the batch's data: a new certificate is prepared and stored beside the old one.
    await getDb()
      .update(batches)
      .set({ notes: 'Line stopped once at 10:40.' })
      .where(eq(batches.id, batchId));
    expect((await requestCertificate(ctx, batchId)).status).toBe('preparing');
    const changed = await buildCertificate({ request, batchId });
    expect(changed).not.toBe(fingerprint);
    expect(await stored()).toHaveLength(2);
    const fresh = await requestCertificate(ctx, batchId);
    expect(fresh.status).toBe('ready');
    if (fresh.status === 'ready')
      expect((await readPdf(fresh.pdf)).text).toContain('Line stopped once at 10:40.');
  });
});

describe('liquid lot from the measure workspace', () => {
  it('a lot sent with the session conditions (POST /api/measurement-sessions) is printed on the certificate', async () => {
    const db = getDb();
    const [batch] = await db.select().from(batches).where(eq(batches.id, batchId));
    const other = await insertBatch(lab.id, batch.coatingId, unique('B'));
    const sample = await insertSample(lab.id, other, 'P1');
    // The body the workspace sends on its first save (components/measure/use-save-drops.ts).
    const created = await api.create(resources.measurementSessions, {
      sessionId: lab.members.analyst.sessionId,
      body: { ...bodies.measurementSession(), liquidLot: 'DIM-LOT-2026-077' },
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.measurementSession.liquidLot).toBe('DIM-LOT-2026-077');
    await insertDrop(lab.id, sample, {
      sessionId: created.body.measurementSession.id,
      revisions: [{ meanDeg: 103 }],
    });
    const { text } = await readPdf((await renderCertificate(certificateRequestOf(ctx), other)).pdf);
    // Whole, not broken across lines inside the code.
    expect(text).toContain('DIM-LOT-2026-077');
  });
});

describe('dynamic wetting on the certificate', () => {
  it('reports advancing, receding and hysteresis per batch with their statistics and the spec verdicts', async () => {
    const db = getDb();
    const coatingId = await insertCoating(lab.id, unique('DYN'));
    await db.insert(specs).values({
      id: newId(),
      organizationId: lab.id,
      coatingId,
      probeLiquidId: 'liquid-water',
      scope: 'mean',
      minAdvancingDeg: 110,
      maxHysteresisDeg: 10,
    });
    const batch = await insertBatch(lab.id, coatingId, unique('B'));
    const sampleId = await insertSample(lab.id, batch, 'P1');
    // Three series of one sample, as saved after the server's re-analysis (values invented).
    const series = [
      { advancing: 112.4, receding: 100.9 },
      { advancing: 113.0, receding: 100.2 },
      { advancing: 111.8, receding: 101.3 },
    ];
    for (const [i, s] of series.entries()) {
      const measurementId = newId();
      await db.insert(dynamicMeasurements).values({
        id: measurementId,
        organizationId: lab.id,
        sampleId,
        probeLiquidId: 'liquid-water',
        kind: 'grow-and-withdraw',
        sourceType: 'frames',
        framePhotoIds: [`frame-${i}`],
        fps: 30,
        measuredAt: new Date(`2026-11-05T10:0${i}:00Z`),
        createdByUserId: lab.members.analyst.userId,
      });
      await db.insert(dynamicAnalyses).values({
        id: newId(),
        organizationId: lab.id,
        measurementId,
        revision: 1,
        method: 'polynomial',
        options: {} as never,
        result: {} as never,
        series: [] as never,
        advancingDeg: s.advancing,
        recedingDeg: s.receding,
        hysteresisDeg: Number((s.advancing - s.receding).toFixed(1)),
        frameCount: 300,
        flaggedFrameCount: 0,
        softwareVersion: 'test',
        createdByUserId: lab.members.analyst.userId,
      });
    }
    const { text } = await readPdf((await renderCertificate(certificateRequestOf(ctx), batch)).pdf);
    expect(text).toContain('Dynamic wetting');
    // Means by hand: advancing (112.4 + 113.0 + 111.8) / 3 = 112.4; receding 100.8;
    // hysteresis (11.5 + 12.8 + 10.5) / 3 = 11.6, above the spec's 10° limit.
    // Each row: quantity, n, mean, SD, 95 % CI, verdict.
    const row = (quantity: string, mean: string, verdict: string) =>
      new RegExp(`Water, ${quantity} 3 ${mean} [\\d.]+ [\\d.]+ – [\\d.]+ ${verdict}`);
    expect(text).toMatch(row('advancing angle', '112\\.4', 'PASS'));
    expect(text).toMatch(row('receding angle', '100\\.8', 'NO SPEC'));
    expect(text).toMatch(row('hysteresis', '11\\.6', 'FAIL'));
  });
});
