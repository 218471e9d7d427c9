'use client';

import { resetPasswordAction } from '@/app/(auth)/account-actions';
import { ActionForm, PasswordField } from './action-form';

export function ResetPasswordForm({ token }: { token: string }) {
  return (
    <ActionForm
      action={resetPasswordAction}
      submit="Set new password"
      busy="Saving…"
      hidden={{ token }}
    >
      {(state) => <PasswordField state={state} label="New password" isNew />}
    </ActionForm>
  );
}
