'use client';

import { useActionState } from 'react';
import { resetPasswordAction } from '@/app/(auth)/account-actions';
import { Field } from './field';
import { FormMessages } from './form-messages';
import { initialFormState } from './form-state';

export function ResetPasswordForm({ token }: { token: string }) {
  const [state, formAction, pending] = useActionState(resetPasswordAction, initialFormState);
  return (
    <form action={formAction} className="space-y-4" noValidate>
      <FormMessages state={state} />
      <input type="hidden" name="token" value={token} />
      <Field
        name="password"
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={state.fields?.password ?? state.fields?.token}
      />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? 'Saving…' : 'Set new password'}
      </button>
    </form>
  );
}
