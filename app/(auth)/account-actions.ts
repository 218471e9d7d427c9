'use server';

import { headers } from 'next/headers';
import { redirect } from 'next/navigation';
import { requestPasswordReset, resetPassword, verifyEmail } from '@/db/queries/account-tokens';
import { acceptInvitation } from '@/db/queries/team';
import { setActiveOrganization } from '@/db/queries/organizations';
import { HttpError } from '@/lib/api/errors';
import { runAfterResponse } from '@/lib/auth/after-response';
import { getAuthContext } from '@/lib/auth/context';
import { isSameOrigin } from '@/lib/auth/origin';
import { hashPassword } from '@/lib/auth/password';
import { startSession } from '@/lib/auth/session';
import { fieldErrors } from '@/lib/validation/auth';
import {
  acceptInvitationSchema,
  forgotPasswordSchema,
  resetPasswordSchema,
  tokenOnlySchema,
} from '@/lib/validation/team';
import type { FormState } from '@/components/auth/form-state';

const BAD_ORIGIN: FormState = {
  message: 'This form did not come from a Beadline page. Reload the page and try again.',
};

function failure(error: unknown, values?: Record<string, string>): FormState {
  if (error instanceof HttpError)
    return { message: error.message, code: error.code, fields: error.fields, values };
  throw error;
}

/** "Forgot password?": the same answer whether or not the address has an account. */
export async function requestPasswordResetAction(
  _previous: FormState,
  formData: FormData,
): Promise<FormState> {
  if (!isSameOrigin(await headers())) return BAD_ORIGIN;
  const values = { email: String(formData.get('email') ?? '') };
  const parsed = forgotPasswordSchema.safeParse({ email: formData.get('email') });
  if (!parsed.success) return { fields: fieldErrors(parsed.error), values };
  // After the answer, so its timing is the same whether or not the address has an account.
  await runAfterResponse('password-reset', () => requestPasswordReset(parsed.data.email));
  return {
    values,
    notice: `If ${parsed.data.email} has a Beadline account, a mail with a link to set a new password is on its way. The link works once, for one hour.`,
  };
}

/** Sets a new password from a reset link; every session of the account ends. */
export async function resetPasswordAction(
  _previous: FormState,
  formData: FormData,
): Promise<FormState> {
  if (!isSameOrigin(await headers())) return BAD_ORIGIN;
  const parsed = resetPasswordSchema.safeParse({
    token: formData.get('token'),
    password: formData.get('password'),
  });
  if (!parsed.success) return { fields: fieldErrors(parsed.error) };
  try {
    await resetPassword({
      token: parsed.data.token,
      passwordHash: await hashPassword(parsed.data.password),
    });
  } catch (error) {
    return failure(error);
  }
  redirect('/sign-in?reason=password-reset');
}

/** A signed-out person without an account accepts an invitation: the account and the membership. */
export async function acceptInvitationWithNewAccount(
  _previous: FormState,
  formData: FormData,
): Promise<FormState> {
  if (!isSameOrigin(await headers())) return BAD_ORIGIN;
  const values = { name: String(formData.get('name') ?? '') };
  const parsed = acceptInvitationSchema.safeParse({
    token: formData.get('token'),
    name: formData.get('name'),
    password: formData.get('password'),
  });
  if (!parsed.success) return { fields: fieldErrors(parsed.error), values };
  try {
    const { userId, organizationId } = await acceptInvitation({
      token: parsed.data.token,
      account: {
        kind: 'new',
        name: parsed.data.name,
        passwordHash: await hashPassword(parsed.data.password),
      },
    });
    await startSession(userId, organizationId);
  } catch (error) {
    return failure(error, values);
  }
  redirect('/dashboard');
}

/** A signed-in user whose e-mail matches the invitation joins the organization. */
export async function acceptInvitationAsMember(
  _previous: FormState,
  formData: FormData,
): Promise<FormState> {
  if (!isSameOrigin(await headers())) return BAD_ORIGIN;
  const parsed = tokenOnlySchema.safeParse({ token: formData.get('token') });
  if (!parsed.success) return { fields: fieldErrors(parsed.error) };
  const ctx = await getAuthContext();
  if (!ctx) return { message: 'You are not signed in any more. Sign in and open the link again.' };
  try {
    const { organizationId } = await acceptInvitation({
      token: parsed.data.token,
      account: { kind: 'existing', userId: ctx.user.id },
    });
    await setActiveOrganization(ctx.sessionId, organizationId);
  } catch (error) {
    return failure(error);
  }
  redirect('/dashboard');
}

/** Confirms the address from the link in the verification mail. */
export async function verifyEmailAction(
  _previous: FormState,
  formData: FormData,
): Promise<FormState> {
  if (!isSameOrigin(await headers())) return BAD_ORIGIN;
  const parsed = tokenOnlySchema.safeParse({ token: formData.get('token') });
  if (!parsed.success) return { fields: fieldErrors(parsed.error) };
  try {
    const { email } = await verifyEmail(parsed.data.token);
    return { notice: `Thank you: ${email} is confirmed.` };
  } catch (error) {
    return failure(error);
  }
}
