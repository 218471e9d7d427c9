'use server';

import { redirect } from 'next/navigation';
import type { z } from 'zod';
import {
  acceptInvitationSchema,
  forgotPasswordSchema,
  resetPasswordSchema,
  tokenOnlySchema,
} from '@/lib/contracts/team';
import { AppError } from '@/lib/app-error';
import { verifyEmail } from '@/server/account/email-verification';
import { requestPasswordReset, resetPassword } from '@/server/account/password-reset';
import { formAction } from '@/server/http/action';
import { joinAsMember, joinWithNewAccount } from '@/server/session/join-organization';

/** "Forgot password?": the same answer whether or not the address has an account. */
export const requestPasswordResetAction = formAction({
  access: 'public',
  input: forgotPasswordSchema,
  keep: ['email'],
  async run({ email }) {
    await requestPasswordReset(email);
    return {
      values: { email },
      notice: `If ${email} has a Beadline account, a mail with a link to set a new password is on its way. The link works once, for one hour.`,
    };
  },
});

/** A signed-out form that goes to another page once its service succeeds. */
function thenGoTo<S extends z.ZodType>(
  input: S,
  run: (values: z.output<S>) => Promise<unknown>,
  to: string,
  keep?: readonly string[],
) {
  return formAction({
    access: 'public',
    input,
    keep,
    async run(values) {
      await run(values);
      redirect(to);
    },
  });
}

/** Sets a new password from a reset link; every session of the account ends. */
export const resetPasswordAction = thenGoTo(
  resetPasswordSchema,
  resetPassword,
  '/sign-in?reason=password-reset',
);

/** A signed-out person without an account accepts an invitation: the account and the membership. */
export const acceptInvitationWithNewAccount = thenGoTo(
  acceptInvitationSchema,
  joinWithNewAccount,
  '/dashboard',
  ['name'],
);

/** A signed-in user whose e-mail matches the invitation joins the organization. */
export const acceptInvitationAsMember = formAction({
  access: 'public',
  input: tokenOnlySchema,
  async run({ token }, { ctx }) {
    if (!ctx) {
      throw new AppError(
        'unauthorized',
        'You are not signed in any more. Sign in and open the link again.',
      );
    }
    await joinAsMember(ctx, token);
    redirect('/dashboard');
  },
});

/** Confirms the address from the link in the verification mail. */
export const verifyEmailAction = formAction({
  access: 'public',
  input: tokenOnlySchema,
  async run({ token }) {
    const { email } = await verifyEmail(token);
    return { notice: `Thank you: ${email} is confirmed.` };
  },
});
