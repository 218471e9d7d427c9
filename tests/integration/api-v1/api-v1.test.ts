import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { and, count, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { ensureProbeLiquidLibrary } from '@/db/probe-liquid-library';
import { analyses, auditEvents, drops, photos } from '@/db/schema';
import * as coatingsRoute from '@/app/api/v1/coatings/route';
import * as samplesRoute from '@/app/api/v1/samples/route';
import * as sampleRoute from '@/app/api/v1/samples/[id]/route';
import * as dropsRoute from '@/app/api/v1/drops/route';
import * as dropRoute from '@/app/api/v1/drops/[id]/route';
import * as photosRoute from '@/app/api/v1/photos/route';
import * as verdictRoute from '@/app/api/v1/batches/[id]/verdict/route';
import { revokeApiToken } from '@/server/api-tokens/revoke';
import { errorBodySchema } from '@/lib/contracts/errors';
import { createMember, createOrganization } from '../support/fixtures';
import { insertBatch, insertCoating, insertSample } from '../support/seed';
import { expireToken, idParams, makeToken, noParams, v1Request } from './support';

const FIXTURE = path.resolve(__dirname, '../../../fixtures/drops/cap-60-noisy.png');

let lab: { id: string };
let admin: Awaited<ReturnType<typeof createMember>>;
let batchId: string;
let sampleId: string;
let both: string;

beforeAll(async () => {
  await ensureProbeLiquidLibrary(getDb());
  lab = await createOrganization();
  admin = await createMember(lab.id, 'admin');
  const coatingId = await insertCoating(lab.id, 'API-1');
  for (const code of ['API-2', 'API-3', 'API-4']) await insertCoating(lab.id, code);
  batchId = await insertBatch(lab.id, coatingId, 'L-API');
  sampleId = await insertSample(lab.id, batchId, 'S-API');
  ({ token: both } = await makeToken(lab.id, admin.userId, 'read-measure'));
});

afterAll(async () => {
  await closeDb();
});

async function expectError(response: Response, status: number, code: string) {
  expect(response.status).toBe(status);
  const body = await response.json();
  expect(errorBodySchema.parse(body).error.code).toBe(code);
  return body;
}

describe('API tokens on /api/v1', () => {
  it('refuses a request without a token, with an unknown one, a revoked one and an expired one', async () => {
    await expectError(
      await coatingsRoute.GET(v1Request('/coatings'), noParams),
      401,
      'unauthorized',
    );
    await expectError(
      await coatingsRoute.GET(v1Request('/coatings', { token: 'bdl_not-a-token' }), noParams),
      401,
      'unauthorized',
    );
    const revoked = await makeToken(lab.id, admin.userId, 'read');
    await revokeApiToken({ organizationId: lab.id, userId: admin.userId }, revoked.id);
    await expectError(
      await coatingsRoute.GET(v1Request('/coatings', { token: revoked.token }), noParams),
      401,
      'unauthorized',
    );
    const expired = await makeToken(lab.id, admin.userId, 'read');
    await expireToken(expired.id);
    await expectError(
      await coatingsRoute.GET(v1Request('/coatings', { token: expired.token }), noParams),
      401,
      'unauthorized',
    );
  });

  it('does not take a signed-in session instead of a token', async () => {
    const request = v1Request('/coatings');
    const withCookie = new Request(request, {
      headers: {
        ...Object.fromEntries(request.headers),
        cookie: `beadline_session=${admin.sessionId}`,
      },
    });
    await expectError(await coatingsRoute.GET(withCookie, noParams), 401, 'unauthorized');
  });

  it('audits the creation and a use from a new address, and keeps the last use', async () => {
    const made = await makeToken(lab.id, admin.userId, 'read');
    const ok = await coatingsRoute.GET(
      v1Request('/coatings', { token: made.token, clientAddress: '192.0.2.7' }),
      noParams,
    );
    expect(ok.status).toBe(200);
    const rows = await getDb()
      .select({ action: auditEvents.action })
      .from(auditEvents)
      .where(and(eq(auditEvents.entityType, 'api_token'), eq(auditEvents.entityId, made.id)));
    expect(rows.map((r) => r.action).sort()).toEqual(['api_token.create', 'api_token.new_address']);
  });
});

describe('reading with cursor pages and ETags', () => {
  it('walks the coatings page by page with nextCursor', async () => {
    const codes: string[] = [];
    let cursor: string | null = null;
    let pages = 0;
    do {
      const query: string = cursor ? `?limit=3&cursor=${cursor}` : '?limit=3';
      const response = await coatingsRoute.GET(
        v1Request(`/coatings${query}`, { token: both }),
        noParams,
      );
      expect(response.status).toBe(200);
      const page = (await response.json()) as {
        items: { code: string }[];
        nextCursor: string | null;
      };
      codes.push(...page.items.map((c) => c.code));
      cursor = page.nextCursor;
      pages += 1;
    } while (cursor);
    expect(pages).toBe(2);
    expect(codes).toEqual(['API-1', 'API-2', 'API-3', 'API-4']);
  });

  it('answers a bad cursor with the field named', async () => {
    const body = await expectError(
      await coatingsRoute.GET(v1Request('/coatings?cursor=zzz', { token: both }), noParams),
      400,
      'invalid_input',
    );
    expect(body.error.fields.cursor).toMatch(/nextCursor/);
  });

  it('answers 304 to If-None-Match with the current ETag, and 200 once it changed', async () => {
    const first = await sampleRoute.GET(
      v1Request(`/samples/${sampleId}`, { token: both }),
      idParams(sampleId),
    );
    const etag = first.headers.get('etag');
    expect(etag).toMatch(/^".+"$/);
    const again = await sampleRoute.GET(
      v1Request(`/samples/${sampleId}`, { token: both, headers: { 'if-none-match': etag! } }),
      idParams(sampleId),
    );
    expect(again.status).toBe(304);
    const other = await sampleRoute.GET(
      v1Request(`/samples/${sampleId}`, { token: both, headers: { 'if-none-match': '"old"' } }),
      idParams(sampleId),
    );
    expect(other.status).toBe(200);
  });
});

describe('creating and measuring', () => {
  it('creates a sample, and the same Idempotency-Key creates it only once', async () => {
    const send = () =>
      samplesRoute.POST(
        v1Request('/samples', {
          token: both,
          json: { batchId, label: 'S-idem' },
          headers: { 'idempotency-key': 'sample-create-1' },
        }),
        noParams,
      );
    const first = await send();
    expect(first.status).toBe(201);
    const created = await first.json();
    const retry = await send();
    expect(retry.status).toBe(201);
    expect(retry.headers.get('idempotent-replayed')).toBe('true');
    expect(await retry.json()).toEqual(created);
    const list = await samplesRoute.GET(
      v1Request(`/samples?batchId=${batchId}`, { token: both }),
      noParams,
    );
    const labels = ((await list.json()) as { items: { label: string }[] }).items.map(
      (s) => s.label,
    );
    expect(labels.filter((l) => l === 'S-idem')).toHaveLength(1);
  });

  it('refuses the same Idempotency-Key with another request', async () => {
    const send = (label: string) =>
      samplesRoute.POST(
        v1Request('/samples', {
          token: both,
          json: { batchId, label },
          headers: { 'idempotency-key': 'sample-create-2' },
        }),
        noParams,
      );
    expect((await send('S-a')).status).toBe(201);
    await expectError(await send('S-b'), 409, 'idempotency_conflict');
  });

  it('checks, stores and analyses a posted photo once, however often it is retried', async () => {
    const bytes = await readFile(FIXTURE);
    const post = () => {
      const form = new FormData();
      form.set('sampleId', sampleId);
      form.set('probeLiquidId', 'liquid-water');
      form.set('method', 'circle');
      form.set(
        'photo',
        new Blob([new Uint8Array(bytes)], { type: 'image/png' }),
        'cap-60-noisy.png',
      );
      return photosRoute.POST(
        v1Request('/photos', { token: both, form, headers: { 'idempotency-key': 'photo-1' } }),
        noParams,
      );
    };
    const first = await post();
    expect(first.status).toBe(201);
    const saved = await first.json();
    expect(saved.revision).toBe(1);
    // The fixture is a spherical cap of 60° (fixtures/generator); the engine reads it within 2°.
    expect(Math.abs(saved.result.meanDeg - 60)).toBeLessThan(2);
    const retry = await post();
    expect(await retry.json()).toEqual(saved);
    const [photoCount] = await getDb()
      .select({ n: count() })
      .from(photos)
      .where(eq(photos.organizationId, lab.id));
    expect(photoCount.n).toBe(1);
    const [analysisCount] = await getDb()
      .select({ n: count() })
      .from(analyses)
      .innerJoin(drops, eq(drops.id, analyses.dropId))
      .where(eq(drops.photoId, saved.photoId));
    expect(analysisCount.n).toBe(1);

    const drop = await dropRoute.GET(
      v1Request(`/drops/${saved.dropId}`, { token: both }),
      idParams(saved.dropId),
    );
    const body = await drop.json();
    expect(body.drop.latestAnalysis.id).toBe(saved.analysisId);
    expect(body.drop.revisions).toHaveLength(1);
    const list = await dropsRoute.GET(
      v1Request(`/drops?sampleId=${sampleId}`, { token: both }),
      noParams,
    );
    expect(((await list.json()) as { items: { id: string }[] }).items.map((d) => d.id)).toEqual([
      saved.dropId,
    ]);
    const verdict = await verdictRoute.GET(
      v1Request(`/batches/${batchId}/verdict`, { token: both }),
      idParams(batchId),
    );
    expect(verdict.status).toBe(200);
  });

  it('refuses a file that is not a photo, saying which part is wrong, and stores nothing', async () => {
    const form = new FormData();
    form.set('sampleId', sampleId);
    form.set('probeLiquidId', 'liquid-water');
    form.set('method', 'circle');
    form.set('photo', new Blob(['not an image'], { type: 'image/png' }), 'notes.png');
    const body = await expectError(
      await photosRoute.POST(v1Request('/photos', { token: both, form }), noParams),
      400,
      'invalid_input',
    );
    expect(body.error.fields.photo).toBeTruthy();
  });

  it('refuses a body larger than the route takes with 413', async () => {
    const big = 'x'.repeat(1024 * 1024 + 10);
    await expectError(
      await samplesRoute.POST(
        v1Request('/samples', { token: both, json: { batchId, label: big } }),
        noParams,
      ),
      413,
      'payload_too_large',
    );
  });
});
