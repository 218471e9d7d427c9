'use client';

import { resetPasswordAction } from '@/app/(auth)/account-actions';
import { TextField } from '@/components/ui/fields';
import { ActionForm, NEW_PASSWORD_HINT } from './action-form';

export function ResetPasswordForm({ token }: { token: string }) {
  return (
    <ActionForm
      action={resetPasswordAction}
      submit="Set new password"
      busy="Saving…"
      hidden={{ token }}
    >
      {(state) => (
        <TextField
          name="password"
          label="New password"
          type="password"
          autoComplete="new-password"
          required
          hint={NEW_PASSWORD_HINT}
          error={state.fields?.password ?? state.fields?.token}
        />
      )}
    </ActionForm>
  );
}
