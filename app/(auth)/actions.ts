'use server';

import { cookies, headers } from 'next/headers';
import { redirect } from 'next/navigation';
import { createUserWithOrganization, EmailTakenError } from '@/db/queries/users';
import { listMembershipsOfUser } from '@/db/queries/organizations';
import { sendEmailVerification } from '@/db/queries/account-tokens';
import { createSessionWithAudit } from '@/db/queries/sessions';
import { getLucia } from '@/lib/auth/lucia';
import { clientAddress, isSameOrigin } from '@/lib/auth/origin';
import { hashPassword } from '@/lib/auth/password';
import { safeRedirectPath } from '@/lib/auth/redirect';
import { startSession } from '@/lib/auth/session';
import { checkCredentials } from '@/lib/auth/sign-in';
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

export async function signUp(_previous: FormState, formData: FormData): Promise<FormState> {
  if (!isSameOrigin(await headers())) return BAD_ORIGIN;
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
  try {
    const { userId, organizationId } = await createUserWithOrganization({
      email: parsed.data.email,
      name: parsed.data.name,
      organizationName: parsed.data.organizationName,
      passwordHash: await hashPassword(parsed.data.password),
    });
    await startSession(userId, organizationId);
    // The confirmation mail is queued; sign-up never waits on it or fails for it.
    await sendEmailVerification(userId).catch((error: unknown) =>
      console.error('[sign-up] could not queue the confirmation mail', error),
    );
  } catch (error) {
    if (error instanceof EmailTakenError) {
      return { fields: { email: error.message }, values };
    }
    throw error;
  }
  redirect('/dashboard');
}
