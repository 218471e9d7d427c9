'use server';

import { redirect } from 'next/navigation';
import { z } from 'zod';
import { signInSchema, signUpSchema } from '@/lib/contracts/auth';
import { signUp as createAccount } from '@/server/account/sign-up';
import { formAction } from '@/server/http/action';
import { signIn as startSignedIn } from '@/server/session/sign-in';

/** Only a path on this site: `/x`, never `//host` or `https://…`. */
function safeNext(value: string | undefined): string {
  const next = value ?? '';
  return next.startsWith('/') && !next.startsWith('//') ? next : '/dashboard';
}

export const signIn = formAction({
  access: 'public',
  input: signInSchema.extend({ next: z.string().optional() }),
  keep: ['email'],
  async run({ email, password, next }, { ipAddress }) {
    await startSignedIn({ email, password, ipAddress });
    redirect(safeNext(next));
  },
});

export const signUp = formAction({
  access: 'public',
  input: signUpSchema,
  keep: ['name', 'email', 'organizationName'],
  async run(input) {
    await createAccount(input);
    redirect('/dashboard');
  },
});
