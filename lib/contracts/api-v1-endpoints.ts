import { z } from 'zod';
import type { Action } from '@/lib/auth/permissions';
import {
  cursorPageSchema,
  v1BatchListQuerySchema,
  v1CoatingListQuerySchema,
  v1DropDetailSchema,
  v1DropListQuerySchema,
  v1DropSchema,
  v1PhotoFieldsSchema,
  v1PhotoResultSchema,
  v1ProbeLiquidListQuerySchema,
  v1Records,
  v1ReviewListQuerySchema,
  v1ReviewSchema,
  v1SampleListQuerySchema,
  v1SessionListQuerySchema,
  v1VerdictSchema,
} from './api-v1';
import { idParamsSchema } from './common';
import { measurementSessionCreateSchema } from './measurement-sessions';
import { sampleCreateSchema } from './samples';

/**
 * Every endpoint of /api/v1 in one table: its method and path, the permission its token's scope
 * must give, its request schemas and its reply. The route handlers are built from these entries
 * (server/http/api-v1.ts) and the OpenAPI document is generated from them, so the two cannot
 * drift apart.
 */
export type V1Endpoint = {
  method: 'GET' | 'POST';
  /** OpenAPI form: /samples/{id}. */
  path: string;
  summary: string;
  access: Action;
  /** "… does not allow you to <what> …" */
  what: string;
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  /** The body is multipart/form-data: `body` describes its text fields, `files` its file parts. */
  multipart?: { files: Record<string, string> };
  maxBodyBytes?: number;
  status: 200 | 201;
  reply: z.ZodType;
};

const define = <E extends Record<string, V1Endpoint>>(endpoints: E) => endpoints;

const readRecords = (
  plural: string,
  path: string,
  query: z.ZodType,
  schemas: { one: z.ZodType; item: z.ZodType },
  key: string,
) =>
  ({
    list: {
      method: 'GET',
      path,
      summary: `List ${plural}`,
      access: 'organization:read',
      what: `read ${plural}`,
      query,
      status: 200,
      reply: cursorPageSchema(schemas.item),
    },
    get: {
      method: 'GET',
      path: `${path}/{id}`,
      summary: `Read one of the ${plural}`,
      access: 'organization:read',
      what: `read ${plural}`,
      params: idParamsSchema,
      status: 200,
      reply: z.object({ [key]: schemas.one }),
    },
  }) satisfies Record<string, V1Endpoint>;

const coatings = readRecords(
  'coatings',
  '/coatings',
  v1CoatingListQuerySchema,
  v1Records.coating,
  'coating',
);
const batches = readRecords(
  'batches',
  '/batches',
  v1BatchListQuerySchema,
  v1Records.batch,
  'batch',
);
const samples = readRecords(
  'samples',
  '/samples',
  v1SampleListQuerySchema,
  v1Records.sample,
  'sample',
);
const probeLiquids = readRecords(
  'probe liquids',
  '/probe-liquids',
  v1ProbeLiquidListQuerySchema,
  v1Records.probeLiquid,
  'probeLiquid',
);
const sessions = readRecords(
  'measurement sessions',
  '/sessions',
  v1SessionListQuerySchema,
  v1Records.measurementSession,
  'measurementSession',
);

/** Largest photo upload, as the browser's uploads (lib/uploads/inspect-image.ts MAX_IMAGE_BYTES) plus the form. */
export const V1_MAX_PHOTO_REQUEST_BYTES = 25 * 1024 * 1024 + 64 * 1024;

export const V1_ENDPOINTS = define({
  listCoatings: coatings.list,
  getCoating: coatings.get,
  listBatches: batches.list,
  getBatch: batches.get,
  getBatchVerdict: {
    method: 'GET',
    path: '/batches/{id}/verdict',
    summary: 'Read the out-of-spec verdict of a batch',
    access: 'results:read-all',
    what: 'read verdicts',
    params: idParamsSchema,
    status: 200,
    reply: z.object({ verdict: v1VerdictSchema }),
  },
  listSamples: samples.list,
  getSample: samples.get,
  createSample: {
    method: 'POST',
    path: '/samples',
    summary: 'Add a sample to a batch',
    access: 'records:write',
    what: 'add samples',
    body: sampleCreateSchema,
    status: 201,
    reply: z.object({ sample: v1Records.sample.one }),
  },
  listProbeLiquids: probeLiquids.list,
  getProbeLiquid: probeLiquids.get,
  listSessions: sessions.list,
  getSession: sessions.get,
  createSession: {
    method: 'POST',
    path: '/sessions',
    summary: 'Start a measurement session',
    access: 'records:write',
    what: 'add measurement sessions',
    body: measurementSessionCreateSchema,
    status: 201,
    reply: z.object({ measurementSession: v1Records.measurementSession.one }),
  },
  listDrops: {
    method: 'GET',
    path: '/drops',
    summary: 'List drops with their latest analysis',
    access: 'results:read-all',
    what: 'read results',
    query: v1DropListQuerySchema,
    status: 200,
    reply: cursorPageSchema(v1DropSchema),
  },
  getDrop: {
    method: 'GET',
    path: '/drops/{id}',
    summary: 'Read a drop with every analysis revision',
    access: 'results:read-all',
    what: 'read results',
    params: idParamsSchema,
    status: 200,
    reply: z.object({ drop: v1DropDetailSchema }),
  },
  listReviews: {
    method: 'GET',
    path: '/reviews',
    summary: 'List reviews and their decisions',
    access: 'results:read-all',
    what: 'read reviews',
    query: v1ReviewListQuerySchema,
    status: 200,
    reply: cursorPageSchema(v1ReviewSchema),
  },
  getReview: {
    method: 'GET',
    path: '/reviews/{id}',
    summary: 'Read a review',
    access: 'results:read-all',
    what: 'read reviews',
    params: idParamsSchema,
    status: 200,
    reply: z.object({ review: v1ReviewSchema }),
  },
  postPhoto: {
    method: 'POST',
    path: '/photos',
    summary: 'Post a drop photo; the server checks, stores and analyses it',
    access: 'records:write',
    what: 'post photos',
    body: v1PhotoFieldsSchema,
    multipart: { files: { photo: 'The drop photo: PNG, JPEG, TIFF or BMP, at most 25 MB.' } },
    maxBodyBytes: V1_MAX_PHOTO_REQUEST_BYTES,
    status: 201,
    reply: v1PhotoResultSchema,
  },
});
export type V1EndpointName = keyof typeof V1_ENDPOINTS;
