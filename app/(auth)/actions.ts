'use server';

import { redirect } from 'next/navigation';
import { z } from 'zod';
import { safeRedirectPath } from '@/lib/auth/redirect';
import { signInSchema, signUpSchema } from '@/lib/contracts/auth';
import { tokenOnlySchema } from '@/lib/contracts/team';
import { finishSignUp, requestSignUp } from '@/server/account/sign-up';
import { formAction } from '@/server/http/action';
import { signIn as startSignedIn } from '@/server/session/sign-in';

export const signIn = formAction({
  access: 'public',
  input: signInSchema.extend({ next: z.string().optional() }),
  keep: ['email'],
  async run({ email, password, next }, { ipAddress }) {
    await startSignedIn({ email, password, ipAddress });
    redirect(safeRedirectPath(next));
  },
});

/**
 * Sign-up answers the same for every address: a link to finish is mailed to a new address, and
 * the holder of an existing account gets a note instead (server/account/sign-up.ts).
 */
export const signUp = formAction({
  access: 'public',
  input: signUpSchema,
  keep: ['name', 'email', 'organizationName'],
  async run(input, { ipAddress }) {
    await requestSignUp(input, ipAddress);
    return {
      notice: `Check your mail: we sent a link to ${input.email} to finish creating your account. It works once, for 24 hours.`,
    };
  },
});

/** The link in the sign-up mail: creates the account and the lab, and signs in. */
export const finishSignUpAction = formAction({
  access: 'public',
  input: tokenOnlySchema,
  async run({ token }) {
    await finishSignUp(token);
    redirect('/dashboard');
  },
});
