'use client';

import { useActionState } from 'react';
import { requestPasswordResetAction } from '@/app/(auth)/account-actions';
import { Field } from './field';
import { FormMessages } from './form-messages';
import { initialFormState } from './form-state';

export function ForgotPasswordForm() {
  const [state, formAction, pending] = useActionState(requestPasswordResetAction, initialFormState);
  return (
    <form action={formAction} className="space-y-4" noValidate>
      <FormMessages state={state} />
      <Field
        name="email"
        label="E-mail"
        type="email"
        autoComplete="email"
        defaultValue={state.values?.email}
        error={state.fields?.email}
      />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? 'Sending…' : 'Send me a link'}
      </button>
    </form>
  );
}
