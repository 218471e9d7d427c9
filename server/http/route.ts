import 'server-only';
import type { z } from 'zod';
import { badOrigin } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { requireApi } from '@/lib/auth/guard';
import { clientAddress, isSameOrigin } from '@/lib/auth/origin';
import type { Action } from '@/lib/auth/permissions';
import { parseSearchParams } from '@/lib/contracts/common';
import { actorOf, type Actor } from '../actor';
import { readJsonObject } from './body';
import { errorResponse } from './errors';

/** Who may call a route: a permission of lib/auth/permissions.ts, or anyone ('public'). */
export type Access = Action | 'public';

type Schema = z.ZodType | undefined;
type Parsed<S extends Schema> = S extends z.ZodType ? z.output<S> : undefined;

export type RouteConfig<A extends Access, P extends Schema, B extends Schema, Q extends Schema> = {
  access: A;
  /** "Your role … does not allow you to <what>." */
  what?: string;
  /** The dynamic segments, e.g. idParamsSchema for `[id]`. */
  params?: P;
  /** The JSON body; parsed (with the size limit) only when given. */
  body?: B;
  /** The search parameters. */
  query?: Q;
  /** Largest body this route takes (default DEFAULT_MAX_BODY_BYTES). */
  maxBodyBytes?: number;
};

/** What a handler gets: the request, who asks, and the parsed params, body and query. */
export type RouteInput<A extends Access, P extends Schema, B extends Schema, Q extends Schema> = {
  request: Request;
  ctx: A extends 'public' ? null : OrgContext;
  /** The organization and user a change is made for and audited as. */
  actor: A extends 'public' ? null : Actor;
  /** The caller's network address, for audit rows and rate limits. */
  ipAddress: string;
  params: Parsed<P>;
  body: Parsed<B>;
  query: Parsed<Q>;
};

/** The second argument Next passes to a route handler. */
type RouteContext<P extends Schema> = P extends z.ZodType
  ? { params: Promise<z.input<P>> }
  : unknown;

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * The wrapper of every route handler: Origin check for mutations (CSRF), sign-in and the
 * permission check, params / query / JSON body parsing (with a size limit), and one error body
 * shape and status table for whatever the handler throws. The handler itself stays thin: it
 * calls one service and maps the result to a Response.
 */
export function route<
  A extends Access,
  P extends Schema = undefined,
  B extends Schema = undefined,
  Q extends Schema = undefined,
>(
  config: RouteConfig<A, P, B, Q>,
  handler: (input: RouteInput<A, P, B, Q>) => Promise<Response>,
): (request: Request, context: RouteContext<P>) => Promise<Response> {
  return async (request, context) => {
    try {
      if (!SAFE_METHODS.has(request.method) && !isSameOrigin(request.headers)) throw badOrigin();
      const ctx = config.access === 'public' ? null : await requireApi(config.access, config.what);
      const rawParams = config.params
        ? await (context as { params: Promise<unknown> }).params
        : undefined;
      const input = {
        request,
        ctx,
        actor: ctx ? actorOf(ctx) : null,
        ipAddress: clientAddress(request.headers),
        params: config.params ? config.params.parse(rawParams) : undefined,
        query: config.query
          ? parseSearchParams(config.query, new URL(request.url).searchParams)
          : undefined,
        body: config.body
          ? config.body.parse(await readJsonObject(request, config.maxBodyBytes))
          : undefined,
      } as RouteInput<A, P, B, Q>;
      return await handler(input);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

/** A JSON reply whose shape the contract's type checks at compile time. */
export function json<T>(data: T, status = 200): Response {
  return Response.json(data, { status });
}
