'use server';

import { cookies, headers } from 'next/headers';
import { redirect } from 'next/navigation';
import { listMembershipsOfUser } from '@/db/queries/organizations';
import { createSessionWithAudit } from '@/db/queries/sessions';
import { getLucia } from '@/lib/auth/lucia';
import { clientAddress, isSameOrigin } from '@/lib/auth/origin';
import { hashPassword } from '@/lib/auth/password';
import { safeRedirectPath } from '@/lib/auth/redirect';
import { startSession } from '@/lib/auth/session';
import { admitSignUp, checkCredentials } from '@/lib/auth/sign-in';
import { runAfterResponse } from '@/lib/auth/after-response';
import { HttpError } from '@/lib/api/errors';
import { finishSignUp, startSignUp } from '@/server/accounts/sign-up';
import { fieldErrors, signInSchema, signUpSchema } from '@/lib/validation/auth';
import type { FormState } from '@/components/auth/form-state';

const BAD_ORIGIN: FormState = {
  message: 'This form did not come from a Beadline page. Reload the page and try again.',
};

export async function signIn(_previous: FormState, formData: FormData): Promise<FormState> {
  const requestHeaders = await headers();
  if (!isSameOrigin(requestHeaders)) return BAD_ORIGIN;
  const values = { email: String(formData.get('email') ?? '') };
  const parsed = signInSchema.safeParse({
    email: formData.get('email'),
    password: formData.get('password'),
  });
  if (!parsed.success) return { fields: fieldErrors(parsed.error), values };
  const outcome = await checkCredentials({
    ...parsed.data,
    ipAddress: clientAddress(requestHeaders),
  });
  if (!outcome.ok) return { message: outcome.message, code: outcome.code, values };
  const memberships = await listMembershipsOfUser(outcome.userId);
  // The session and the sign-in's audit row are written in one transaction.
  const sessionId = await createSessionWithAudit({
    userId: outcome.userId,
    organizationId: memberships[0]?.organizationId ?? null,
    ipAddress: clientAddress(requestHeaders),
  });
  const cookie = getLucia().createSessionCookie(sessionId);
  (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
  redirect(safeRedirectPath(formData.get('next')));
}

/**
 * Sign-up answers the same for every address: a link to finish is mailed to a new address, and
 * the holder of an existing account gets a note instead (server/accounts/sign-up.ts), after the
 * answer is sent. Throttled per network address.
 */
export async function signUp(_previous: FormState, formData: FormData): Promise<FormState> {
  const requestHeaders = await headers();
  if (!isSameOrigin(requestHeaders)) return BAD_ORIGIN;
  const raw = {
    name: formData.get('name'),
    email: formData.get('email'),
    password: formData.get('password'),
    organizationName: formData.get('organizationName'),
  };
  const values = {
    name: String(raw.name ?? ''),
    email: String(raw.email ?? ''),
    organizationName: String(raw.organizationName ?? ''),
  };
  const parsed = signUpSchema.safeParse(raw);
  if (!parsed.success) return { fields: fieldErrors(parsed.error), values };
  const admitted = await admitSignUp({
    email: parsed.data.email,
    ipAddress: clientAddress(requestHeaders),
  });
  if (!admitted.ok) return { message: admitted.message, code: 'too_many_attempts', values };
  // Hashed for every address, so the answer takes as long either way.
  const passwordHash = await hashPassword(parsed.data.password);
  await runAfterResponse('sign-up', () =>
    startSignUp({
      email: parsed.data.email,
      name: parsed.data.name,
      organizationName: parsed.data.organizationName,
      passwordHash,
    }),
  );
  return {
    notice: `Check your mail: we sent a link to ${parsed.data.email} to finish creating your account. It works once, for 24 hours.`,
  };
}

/** The link in the sign-up mail: creates the account and the lab, and signs in. */
export async function finishSignUpAction(_previous: FormState, formData: FormData): Promise<FormState> {
  if (!isSameOrigin(await headers())) return BAD_ORIGIN;
  const token = String(formData.get('token') ?? '');
  try {
    const { userId, organizationId } = await finishSignUp(token);
    await startSession(userId, organizationId);
  } catch (error) {
    if (error instanceof HttpError) return { message: error.message, code: error.code };
    throw error;
  }
  redirect('/dashboard');
}
