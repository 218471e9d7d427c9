import 'server-only';
import { headers } from 'next/headers';
import { unstable_rethrow } from 'next/navigation';
import type { z } from 'zod';
import { badOrigin } from '@/lib/app-error';
import { getAuthContext, type AuthContext, type OrgContext } from '@/lib/auth/context';
import { requireApi, requireSignedIn } from '@/lib/auth/guard';
import { clientAddress, isSameOrigin } from '@/lib/auth/origin';
import type { Action } from '@/lib/auth/permissions';
import type { ErrorBody } from '@/lib/contracts/errors';
import type { FormState } from '@/lib/contracts/forms';
import { describeError } from './errors';

/**
 * Who may run a server action: a permission (signed in, in an organization, with that
 * permission), any signed-in user, or anyone (the sign-in and account forms).
 */
export type ActionAccess = Action | 'signed-in' | 'public';

type ContextFor<A extends ActionAccess> = A extends 'public'
  ? AuthContext | null
  : A extends 'signed-in'
    ? AuthContext
    : OrgContext;

/** Who asks, and from where (for audit rows and rate limits). */
export type ActionInput<A extends ActionAccess> = { ctx: ContextFor<A>; ipAddress: string };

export type ActionResult<T = undefined> = { ok: true; data: T } | ({ ok: false } & ErrorBody);

/**
 * The wrapper of every server action: the Origin check (CSRF), sign-in and the permission check,
 * and errors as the same `{ error: { code, message, fields? } }` a route handler answers. Next's
 * own control flow (redirect(), notFound()) passes through.
 */
export async function runAction<A extends ActionAccess, T>(
  access: A,
  body: (input: ActionInput<A>) => Promise<T>,
  options: { what?: string } = {},
): Promise<ActionResult<T>> {
  try {
    const requestHeaders = await headers();
    if (!isSameOrigin(requestHeaders)) throw badOrigin();
    const ctx =
      access === 'public'
        ? await getAuthContext()
        : access === 'signed-in'
          ? await requireSignedIn()
          : await requireApi(access as Action, options.what);
    const data = await body({
      ctx: ctx as ContextFor<A>,
      ipAddress: clientAddress(requestHeaders),
    });
    return { ok: true, data };
  } catch (error) {
    unstable_rethrow(error);
    return { ok: false, ...describeError(error, 'action').body };
  }
}

/** The entries of a form as a plain object for a zod schema (absent fields stay absent). */
export function formFields(formData: FormData): Record<string, FormDataEntryValue> {
  return Object.fromEntries(formData.entries());
}

/**
 * A form's server action, for `useActionState`: parses the form with `input`, runs `run` inside
 * runAction and answers a FormState. A failure keeps the `keep` fields' text (never passwords)
 * so the form shows what was typed; a field error replaces the general message.
 */
export function formAction<A extends ActionAccess, S extends z.ZodType>(config: {
  access: A;
  what?: string;
  input: S;
  keep?: readonly string[];
  run: (input: z.output<S>, caller: ActionInput<A>) => Promise<FormState>;
}): (previous: FormState, formData: FormData) => Promise<FormState> {
  return async (_previous, formData) => {
    const result = await runAction(
      config.access,
      (caller) => config.run(config.input.parse(formFields(formData)), caller),
      { what: config.what },
    );
    if (result.ok) return result.data;
    const values = Object.fromEntries(
      (config.keep ?? []).map((key) => [key, String(formData.get(key) ?? '')]),
    );
    const { code, message, fields } = result.error;
    return {
      message: fields ? undefined : message,
      fields,
      code,
      ...(config.keep?.length ? { values } : {}),
    };
  };
}
