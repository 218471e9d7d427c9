import 'server-only';
import { createHash } from 'node:crypto';
import type { z } from 'zod';
import { AppError } from '@/lib/app-error';
import { clientAddress } from '@/lib/auth/origin';
import { RateLimiter } from '@/lib/auth/rate-limit';
import { parseSearchParams } from '@/lib/contracts/common';
import { authenticateApiToken, bearerToken, type TokenCaller } from '../api-tokens/authenticate';
import {
  claimIdempotencyKey,
  completeIdempotencyKey,
  releaseIdempotencyKey,
} from '../api-v1/idempotency';
import type { V1Endpoint } from '@/lib/contracts/api-v1-endpoints';
import { DEFAULT_MAX_BODY_BYTES, parseJsonObject, parseMultipart, readBodyBytes } from './body';
import { describeError } from './errors';

/*
 * The wrapper of every /api/v1 route handler: the only place where `Authorization: Bearer` is
 * accepted (pages, server actions and the other routes read the session cookie only, and this
 * wrapper never does). It checks the token and its scope, the token's rate limit, reads the body
 * with its size limit (JSON, or multipart with files), makes POSTs with an Idempotency-Key safe to
 * retry, answers GETs with an ETag (304 on If-None-Match), and puts every failure in the error
 * body of lib/contracts/errors.ts.
 */

type Parsed<S> = S extends z.ZodType ? z.output<S> : undefined;

export type ApiV1Input<E extends V1Endpoint> = {
  request: Request;
  caller: TokenCaller;
  ipAddress: string;
  params: Parsed<E['params']>;
  query: Parsed<E['query']>;
  body: Parsed<E['body']>;
  /** The file parts of a multipart body. */
  files: Record<string, File>;
};

/** The second argument Next passes to a route handler. */
type RouteContext<P> = P extends z.ZodType ? { params: Promise<z.input<P>> } : unknown;

/** Requests per token per minute (API_RATE_LIMIT_PER_MINUTE, default 120). */
export function apiRateLimitPerMinute(env: NodeJS.ProcessEnv = process.env): number {
  const value = Number(env.API_RATE_LIMIT_PER_MINUTE);
  return Number.isInteger(value) && value > 0 ? value : 120;
}

let limiter: RateLimiter | null = null;
const rateLimiter = () => (limiter ??= new RateLimiter(apiRateLimitPerMinute(), 60_000));

function rateLimited(retryAfterSeconds: number): AppError {
  return new AppError(
    'rate_limited',
    `This API token sent too many requests. Wait ${retryAfterSeconds} s (Retry-After) and send again.`,
    { extra: { retryAfterSeconds } },
  );
}

export function apiErrorResponse(error: unknown): Response {
  const { status, body } = describeError(error, 'api/v1');
  const headers = new Headers();
  const retry = (body as { retryAfterSeconds?: unknown }).retryAfterSeconds;
  if (typeof retry === 'number') headers.set('Retry-After', String(retry));
  return Response.json(body, { status, headers });
}

/** A reply body's ETag: the SHA-256 of its bytes. */
function etagOf(text: string): string {
  return `"${createHash('sha256').update(text).digest('base64url')}"`;
}

function ifNoneMatchHits(header: string | null, etag: string): boolean {
  if (!header) return false;
  return header
    .split(',')
    .map((tag) => tag.trim().replace(/^W\//, ''))
    .some((tag) => tag === '*' || tag === etag);
}

/** GET replies get an ETag; a matching If-None-Match gets 304 without a body. */
async function withEtag(request: Request, response: Response): Promise<Response> {
  if (response.status !== 200) return response;
  const text = await response.text();
  const etag = etagOf(text);
  const headers = new Headers(response.headers);
  headers.set('ETag', etag);
  headers.set('Cache-Control', 'private, no-cache');
  if (ifNoneMatchHits(request.headers.get('if-none-match'), etag)) {
    headers.delete('content-type');
    return new Response(null, { status: 304, headers });
  }
  return new Response(text, { status: 200, headers });
}

/** What makes two requests the same: method, path and query, and the body's content. */
function requestHash(request: Request, content: Uint8Array[]): string {
  const url = new URL(request.url);
  const hash = createHash('sha256').update(`${request.method} ${url.pathname}${url.search}\n`);
  for (const part of content) hash.update(part);
  return hash.digest('hex');
}

/**
 * A multipart body's content without its boundary (random for every request a client builds):
 * the fields by name, then each file's name and bytes.
 */
async function multipartContent(form: {
  fields: Record<string, string>;
  files: Record<string, File>;
}): Promise<Uint8Array[]> {
  const encoder = new TextEncoder();
  const parts = [encoder.encode(JSON.stringify(Object.entries(form.fields).sort()))];
  for (const [name, file] of Object.entries(form.files).sort(([a], [b]) => a.localeCompare(b))) {
    parts.push(encoder.encode(`\n${name}:${file.name}:${file.size}\n`));
    parts.push(new Uint8Array(await file.arrayBuffer()));
  }
  return parts;
}

/**
 * A route handler of /api/v1 from its entry in V1_ENDPOINTS (lib/contracts/api-v1-endpoints.ts):
 * the handler calls one service and hands back the reply, answered with the entry's status.
 */
export function apiV1Route<E extends V1Endpoint>(
  endpoint: E,
  handler: (input: ApiV1Input<E>) => Promise<z.output<E['reply']>>,
): (request: Request, context: RouteContext<E['params']>) => Promise<Response> {
  const config = endpoint;
  return async (request, context) => {
    let claimed: { tokenId: string; key: string } | null = null;
    try {
      const ipAddress = clientAddress(request.headers);
      const caller = await authenticateApiToken(
        bearerToken(request.headers.get('authorization')),
        config.access,
        ipAddress,
        config.what,
      );
      const decision = rateLimiter().take(caller.tokenId);
      if (!decision.ok) throw rateLimited(decision.retryAfterSeconds);

      const rawParams = config.params
        ? await (context as { params: Promise<unknown> }).params
        : undefined;
      const params = config.params ? config.params.parse(rawParams) : undefined;
      const query = config.query
        ? parseSearchParams(config.query, new URL(request.url).searchParams)
        : undefined;
      let body: unknown;
      let files: Record<string, File> = {};
      if (config.body) {
        const bytes = await readBodyBytes(request, config.maxBodyBytes ?? DEFAULT_MAX_BODY_BYTES);
        let content: Uint8Array[] = [bytes];
        if (config.multipart) {
          const form = await parseMultipart(bytes, request.headers.get('content-type'));
          body = config.body.parse(form.fields);
          files = form.files;
          content = await multipartContent(form);
        } else {
          body = config.body.parse(parseJsonObject(bytes));
        }
        const idempotencyKey = request.headers.get('idempotency-key')?.trim();
        if (idempotencyKey !== undefined) {
          const claim = await claimIdempotencyKey(
            caller.tokenId,
            idempotencyKey,
            requestHash(request, content),
          );
          if (claim.kind === 'replay') {
            return Response.json(claim.reply.body, {
              status: claim.reply.status,
              headers: { 'Idempotent-Replayed': 'true' },
            });
          }
          claimed = { tokenId: caller.tokenId, key: idempotencyKey };
        }
      }
      const input = { request, caller, ipAddress, params, query, body, files } as ApiV1Input<E>;
      const response = Response.json(await handler(input), { status: config.status });
      if (claimed) return await remember(claimed, response);
      return request.method === 'GET' ? await withEtag(request, response) : response;
    } catch (error) {
      const response = apiErrorResponse(error);
      if (claimed) return remember(claimed, response);
      return response;
    }
  };
}

/**
 * Keeps the reply to an idempotent request for its retries; a failure on our side (5xx) is not
 * kept, so a retry does the work again.
 */
async function remember(
  claimed: { tokenId: string; key: string },
  response: Response,
): Promise<Response> {
  if (response.status >= 500) {
    await releaseIdempotencyKey(claimed.tokenId, claimed.key);
    return response;
  }
  const text = await response.text();
  await completeIdempotencyKey(claimed.tokenId, claimed.key, {
    status: response.status,
    body: text ? JSON.parse(text) : null,
  });
  return new Response(text, { status: response.status, headers: response.headers });
}
