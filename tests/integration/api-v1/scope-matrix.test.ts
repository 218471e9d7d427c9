import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { ensureProbeLiquidLibrary } from '@/db/probe-liquid-library';
import * as batches from '@/app/api/v1/batches/route';
import * as batch from '@/app/api/v1/batches/[id]/route';
import * as verdict from '@/app/api/v1/batches/[id]/verdict/route';
import * as coatings from '@/app/api/v1/coatings/route';
import * as coating from '@/app/api/v1/coatings/[id]/route';
import * as drops from '@/app/api/v1/drops/route';
import * as photos from '@/app/api/v1/photos/route';
import * as probeLiquids from '@/app/api/v1/probe-liquids/route';
import * as probeLiquid from '@/app/api/v1/probe-liquids/[id]/route';
import * as reviews from '@/app/api/v1/reviews/route';
import * as samples from '@/app/api/v1/samples/route';
import * as sample from '@/app/api/v1/samples/[id]/route';
import * as sessions from '@/app/api/v1/sessions/route';
import { API_TOKEN_SCOPES, type ApiTokenScope } from '@/lib/auth/permissions';
import { createMember, createOrganization } from '../support/fixtures';
import { insertBatch, insertCoating, insertSample } from '../support/seed';
import { idParams, makeToken, noParams, v1Request } from './support';

/*
 * Every scope against every kind of route: reading needs `read`, creating and posting photos
 * need `measure`; a scope that does not allow it is 403 forbidden, whatever the body.
 */

let lab: { id: string };
let coatingId: string;
let batchId: string;
let sampleId: string;
const tokens = {} as Record<ApiTokenScope, string>;

beforeAll(async () => {
  await ensureProbeLiquidLibrary(getDb());
  lab = await createOrganization();
  const admin = await createMember(lab.id, 'admin');
  coatingId = await insertCoating(lab.id, 'MX-1');
  batchId = await insertBatch(lab.id, coatingId, 'L-MX');
  sampleId = await insertSample(lab.id, batchId, 'S-MX');
  for (const scope of API_TOKEN_SCOPES) {
    tokens[scope] = (await makeToken(lab.id, admin.userId, scope)).token;
  }
});

afterAll(async () => {
  await closeDb();
});

type Case = { name: string; needs: 'read' | 'measure'; call: (token: string) => Promise<Response> };

const get =
  (handler: (r: Request, c: never) => Promise<Response>, path: string, id?: string) =>
  (token: string) =>
    handler(v1Request(path, { token }), (id ? idParams(id) : noParams) as never);

const CASES: Case[] = [
  { name: 'GET /coatings', needs: 'read', call: (t) => get(coatings.GET, '/coatings')(t) },
  {
    name: 'GET /coatings/{id}',
    needs: 'read',
    call: (t) => get(coating.GET, `/coatings/${coatingId}`, coatingId)(t),
  },
  { name: 'GET /batches', needs: 'read', call: (t) => get(batches.GET, '/batches')(t) },
  {
    name: 'GET /batches/{id}',
    needs: 'read',
    call: (t) => get(batch.GET, `/batches/${batchId}`, batchId)(t),
  },
  {
    name: 'GET /batches/{id}/verdict',
    needs: 'read',
    call: (t) => get(verdict.GET, `/batches/${batchId}/verdict`, batchId)(t),
  },
  { name: 'GET /samples', needs: 'read', call: (t) => get(samples.GET, '/samples')(t) },
  {
    name: 'GET /samples/{id}',
    needs: 'read',
    call: (t) => get(sample.GET, `/samples/${sampleId}`, sampleId)(t),
  },
  {
    name: 'GET /probe-liquids',
    needs: 'read',
    call: (t) => get(probeLiquids.GET, '/probe-liquids')(t),
  },
  {
    name: 'GET /probe-liquids/{id}',
    needs: 'read',
    call: (t) => get(probeLiquid.GET, '/probe-liquids/liquid-water', 'liquid-water')(t),
  },
  { name: 'GET /sessions', needs: 'read', call: (t) => get(sessions.GET, '/sessions')(t) },
  { name: 'GET /drops', needs: 'read', call: (t) => get(drops.GET, '/drops')(t) },
  { name: 'GET /reviews', needs: 'read', call: (t) => get(reviews.GET, '/reviews')(t) },
  {
    name: 'POST /samples',
    needs: 'measure',
    call: (t) =>
      samples.POST(
        v1Request('/samples', { token: t, json: { batchId, label: `S-${t.slice(-6)}` } }),
        noParams,
      ),
  },
  {
    name: 'POST /sessions',
    needs: 'measure',
    call: (t) =>
      sessions.POST(
        v1Request('/sessions', {
          token: t,
          json: {
            operatorName: 'Stage 2 camera',
            measuredAt: '2026-11-20T09:00:00Z',
            temperatureC: 22,
            humidityPct: 45,
            dropVolumeUl: 3,
            instrumentNotes: '',
          },
        }),
        noParams,
      ),
  },
  {
    name: 'POST /photos',
    needs: 'measure',
    // No photo part: a token allowed to post gets 400 naming the part; one that is not, 403.
    call: (t) => {
      const form = new FormData();
      form.set('sampleId', sampleId);
      form.set('probeLiquidId', 'liquid-water');
      form.set('method', 'circle');
      return photos.POST(v1Request('/photos', { token: t, form }), noParams);
    },
  },
];

const allows = (scope: ApiTokenScope, needs: 'read' | 'measure') =>
  scope === 'read-measure' || scope === needs;

describe('token scope × route', () => {
  for (const scope of API_TOKEN_SCOPES) {
    for (const c of CASES) {
      const expected = allows(scope, c.needs);
      it(`${scope} ${expected ? 'may' : 'may not'} ${c.name}`, async () => {
        const response = await c.call(tokens[scope]);
        if (expected) {
          expect(response.status, await response.clone().text()).toBeLessThan(403);
          if (c.name === 'POST /photos')
            expect((await response.json()).error.fields.photo).toBeTruthy();
        } else {
          expect(response.status).toBe(403);
          expect((await response.json()).error.code).toBe('forbidden');
        }
      });
    }
  }
});
