'use client';

import { useActionState } from 'react';
import { signUp } from '@/app/(auth)/actions';
import { Field } from './field';
import { FormMessages } from './form-messages';
import { initialFormState } from './form-state';

export function SignUpForm() {
  const [state, formAction, pending] = useActionState(signUp, initialFormState);
  // Sent: the same words whether or not the address already had an account.
  if (state.notice) return <FormMessages state={state} />;
  return (
    <form action={formAction} className="space-y-4" noValidate>
      <FormMessages state={state} />
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
