'use client';

import { requestPasswordResetAction } from '@/app/(auth)/account-actions';
import { TextField } from '@/components/ui/fields';
import { ActionForm } from './action-form';

export function ForgotPasswordForm() {
  return (
    <ActionForm action={requestPasswordResetAction} submit="Send me a link" busy="Sending…">
      {(state) => (
        <TextField
          name="email"
          label="E-mail"
          type="email"
          autoComplete="email"
          required
          defaultValue={state.values?.email}
          error={state.fields?.email}
        />
      )}
    </ActionForm>
  );
}
