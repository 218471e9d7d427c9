'use client';

import { useActionState } from 'react';
import { signUp } from '@/app/(auth)/actions';
import { Field } from './field';
import { initialFormState } from './form-state';

export function SignUpForm() {
  const [state, formAction, pending] = useActionState(signUp, initialFormState);
  return (
    <form action={formAction} className="space-y-4" noValidate>
      {state.message ? (
        <p role="alert" className="rounded-md border border-coral-100 bg-coral-50 px-3 py-2 text-sm text-coral-900">
          {state.message}
        </p>
      ) : null}
      <Field name="name" label="Your name" autoComplete="name" defaultValue={state.values?.name} error={state.fields?.name} />
      <Field name="email" label="Work e-mail" type="email" autoComplete="email" defaultValue={state.values?.email} error={state.fields?.email} />
      <Field
        name="password"
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={state.fields?.password}
      />
      <Field
        name="organizationName"
        label="Lab or organization"
        autoComplete="organization"
        defaultValue={state.values?.organizationName}
        hint="You become its admin and can invite your team."
        error={state.fields?.organizationName}
      />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? 'Creating your lab…' : 'Create account'}
      </button>
    </form>
  );
}
