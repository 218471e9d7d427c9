import 'server-only';
import { forbidden, redirect } from 'next/navigation';
import { headers } from 'next/headers';
import { z } from 'zod';
import {
  HttpError,
  badOrigin,
  forbidden as forbiddenError,
  unauthorized,
  type ErrorBody,
} from '@/lib/api/errors';
import { fieldErrors } from '@/lib/validation/auth';
import { getAuthContext, type OrgContext } from './context';
import { isSameOrigin } from './origin';
import { can, type Action } from './permissions';

/** Pages: signed out → sign-in page; signed in without the permission → the 403 page. */
export async function requirePage(action: Action): Promise<OrgContext> {
  const ctx = await getAuthContext();
  if (!ctx) redirect('/sign-in');
  if (!ctx.organization) redirect('/sign-in?reason=no-organization');
  if (!can(ctx.organization.role, action)) forbidden();
  return ctx as OrgContext;
}

/** Route handlers and server actions: the same decision, as an HttpError. */
export async function requireApi(action: Action, what?: string): Promise<OrgContext> {
  const ctx = await getAuthContext();
  if (!ctx) throw unauthorized();
  if (!ctx.organization) throw forbiddenError('work in an organization you are not a member of');
  if (!can(ctx.organization.role, action)) throw forbiddenError(what);
  return ctx as OrgContext;
}

export function errorResponse(error: unknown): Response {
  if (error instanceof HttpError) return Response.json(error.toBody(), { status: error.status });
  if (error instanceof z.ZodError) {
    const body: ErrorBody = {
      error: {
        code: 'invalid_input',
        message: 'Some fields are not valid. Correct them and try again.',
        fields: fieldErrors(error),
      },
    };
    return Response.json(body, { status: 400 });
  }
  console.error('[api] unexpected error', error);
  const body: ErrorBody = {
    error: { code: 'internal', message: 'Something went wrong on our side. Try again in a moment.' },
  };
  return Response.json(body, { status: 500 });
}

type RouteHandler<P> = (request: Request, context: P) => Promise<Response>;

/**
 * Wraps a route handler: Origin check for mutations, authentication, the permission check and
 * the error body shape, in one place.
 */
export function route<P = unknown>(
  action: Action,
  handler: (request: Request, ctx: OrgContext, params: P) => Promise<Response>,
  options: { what?: string } = {},
): RouteHandler<P> {
  return async (request, params) => {
    try {
      if (!['GET', 'HEAD', 'OPTIONS'].includes(request.method) && !isSameOrigin(request.headers)) {
        throw badOrigin();
      }
      const ctx = await requireApi(action, options.what);
      return await handler(request, ctx, params);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

export type ActionResult<T = undefined> = { ok: true; data: T } | ({ ok: false } & ErrorBody);

export function toActionError(error: unknown): { ok: false } & ErrorBody {
  if (error instanceof HttpError) return { ok: false, ...error.toBody() };
  if (error instanceof z.ZodError) {
    return {
      ok: false,
      error: {
        code: 'invalid_input',
        message: 'Some fields are not valid. Correct them and try again.',
        fields: fieldErrors(error),
      },
    };
  }
  console.error('[action] unexpected error', error);
  return {
    ok: false,
    error: { code: 'internal', message: 'Something went wrong on our side. Try again in a moment.' },
  };
}

/** Server actions: the same Origin, sign-in and permission checks as route handlers. */
export async function runAction<T>(
  action: Action,
  body: (ctx: OrgContext) => Promise<T>,
  options: { what?: string } = {},
): Promise<ActionResult<T>> {
  try {
    if (!isSameOrigin(await headers())) throw badOrigin();
    const ctx = await requireApi(action, options.what);
    return { ok: true, data: await body(ctx) };
  } catch (error) {
    return toActionError(error);
  }
}
