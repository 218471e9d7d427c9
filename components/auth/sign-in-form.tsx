'use client';

import { useActionState } from 'react';
import { signIn } from '@/app/(auth)/actions';
import { Field } from './field';
import { initialFormState } from './form-state';

export function SignInForm({ next }: { next?: string }) {
  const [state, formAction, pending] = useActionState(signIn, initialFormState);
  return (
    <form action={formAction} className="space-y-4" noValidate>
      {state.message ? (
        <p role="alert" className="rounded-md border border-coral-100 bg-coral-50 px-3 py-2 text-sm text-coral-900">
          {state.message}
        </p>
      ) : null}
      <input type="hidden" name="next" value={next ?? ''} />
      <Field name="email" label="E-mail" type="email" autoComplete="email" defaultValue={state.values?.email} error={state.fields?.email} />
      <Field name="password" label="Password" type="password" autoComplete="current-password" error={state.fields?.password} />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
