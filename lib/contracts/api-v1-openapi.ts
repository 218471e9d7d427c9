import { z } from 'zod';
import { API_TOKEN_SCOPES, API_TOKEN_SCOPE_ACTIONS, type Action } from '@/lib/auth/permissions';
import { V1_ENDPOINTS, type V1Endpoint } from './api-v1-endpoints';
import { errorBodySchema } from './errors';

/*
 * The OpenAPI 3.1 document of /api/v1, generated from V1_ENDPOINTS: the same zod schemas the
 * routes parse with and answer by (zod's own JSON Schema output, draft 2020-12, which is the
 * schema dialect of OpenAPI 3.1).
 */

type JsonSchema = Record<string, unknown>;

function jsonSchema(schema: z.ZodType, io: 'input' | 'output'): JsonSchema {
  const out = z.toJSONSchema(schema, {
    target: 'draft-2020-12',
    io,
    unrepresentable: 'any',
    override: (ctx) => {
      const def = (ctx.zodSchema as { _zod: { def: { type: string } } })._zod.def;
      if (def.type === 'date') {
        ctx.jsonSchema.type = 'string';
        ctx.jsonSchema.format = 'date-time';
      }
    },
  }) as JsonSchema;
  delete out.$schema;
  return out;
}

function scopesFor(action: Action): string[] {
  return API_TOKEN_SCOPES.filter((scope) =>
    (API_TOKEN_SCOPE_ACTIONS[scope] as readonly Action[]).includes(action),
  );
}

const errorRef = { $ref: '#/components/responses/Error' };

function parameters(schema: z.ZodType | undefined, where: 'path' | 'query') {
  if (!schema) return [];
  const object = jsonSchema(schema, 'input') as {
    properties?: Record<string, JsonSchema>;
    required?: string[];
  };
  return Object.entries(object.properties ?? {}).map(([name, property]) => ({
    name,
    in: where,
    required: where === 'path' || (object.required ?? []).includes(name),
    ...(typeof property.description === 'string' ? { description: property.description } : {}),
    schema: property,
  }));
}

function requestBody(endpoint: V1Endpoint) {
  if (!endpoint.body) return undefined;
  const fields = jsonSchema(endpoint.body, 'input') as {
    properties?: Record<string, JsonSchema>;
    required?: string[];
  };
  if (!endpoint.multipart) {
    return { required: true, content: { 'application/json': { schema: fields } } };
  }
  const files = Object.fromEntries(
    Object.entries(endpoint.multipart.files).map(([name, description]) => [
      name,
      { type: 'string', contentMediaType: 'application/octet-stream', description },
    ]),
  );
  return {
    required: true,
    content: {
      'multipart/form-data': {
        schema: {
          type: 'object',
          properties: { ...fields.properties, ...files },
          required: [...(fields.required ?? []), ...Object.keys(files)],
        },
      },
    },
  };
}

function operation(name: string, endpoint: V1Endpoint) {
  const scopes = scopesFor(endpoint.access);
  const headers =
    endpoint.method === 'POST'
      ? [
          {
            name: 'Idempotency-Key',
            in: 'header',
            required: false,
            description:
              'Any unique text (a UUID). A retry with the same key answers the first reply and does nothing again.',
            schema: { type: 'string', maxLength: 200 },
          },
        ]
      : [
          {
            name: 'If-None-Match',
            in: 'header',
            required: false,
            description: 'The ETag of a reply you have; 304 when it is still current.',
            schema: { type: 'string' },
          },
        ];
  const body = requestBody(endpoint);
  return {
    operationId: name,
    summary: endpoint.summary,
    description: `Token scopes: ${scopes.join(', ')}.`,
    'x-scopes': scopes,
    parameters: [
      ...parameters(endpoint.params, 'path'),
      ...parameters(endpoint.query, 'query'),
      ...headers,
    ],
    ...(body ? { requestBody: body } : {}),
    responses: {
      [String(endpoint.status)]: {
        description: endpoint.status === 201 ? 'Created' : 'OK',
        content: { 'application/json': { schema: jsonSchema(endpoint.reply, 'output') } },
      },
      ...(endpoint.method === 'GET'
        ? { '304': { description: 'Not modified (If-None-Match)' } }
        : {}),
      '400': errorRef,
      '401': errorRef,
      '403': errorRef,
      '404': errorRef,
      '409': errorRef,
      '413': errorRef,
      '422': errorRef,
      '429': errorRef,
    },
  };
}

export const OPENAPI_PATH = '/openapi.json';

/** The OpenAPI 3.1 document of /api/v1. */
export function buildOpenApiDocument(version: string) {
  const paths: Record<string, Record<string, unknown>> = {
    [OPENAPI_PATH]: {
      get: {
        operationId: 'getOpenApiDocument',
        summary: 'This document',
        security: [],
        responses: {
          '200': {
            description: 'OK',
            content: { 'application/json': { schema: { type: 'object' } } },
          },
        },
      },
    },
  };
  for (const [name, endpoint] of Object.entries(V1_ENDPOINTS) as [string, V1Endpoint][]) {
    paths[endpoint.path] ??= {};
    paths[endpoint.path][endpoint.method.toLowerCase()] = operation(name, endpoint);
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Beadline API',
      version,
      description:
        'Records, drop results, reviews and verdicts of one organization, for instruments and LIMS. Send an API token (made by an admin on the API access page) as `Authorization: Bearer <token>`. Lists are paged with `limit` and `cursor` (send back `nextCursor`). Every error is `{ "error": { "code", "message", "fields"? } }`; 429 comes with `Retry-After`.',
    },
    servers: [{ url: '/api/v1' }],
    security: [{ bearerToken: [] }],
    paths,
    components: {
      securitySchemes: {
        bearerToken: { type: 'http', scheme: 'bearer', description: 'An API token (bdl_…).' },
      },
      schemas: { Error: jsonSchema(errorBodySchema, 'output') },
      responses: {
        Error: {
          description: 'The error body; its code says what went wrong.',
          headers: {
            'Retry-After': {
              description: 'Seconds to wait (429 only).',
              schema: { type: 'integer' },
            },
          },
          content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
        },
      },
    },
  };
}
