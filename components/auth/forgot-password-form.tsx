'use client';

import { requestPasswordResetAction } from '@/app/(auth)/account-actions';
import { ActionForm, EmailField } from './action-form';

export function ForgotPasswordForm() {
  return (
    <ActionForm action={requestPasswordResetAction} submit="Send me a link" busy="Sending…">
      {(state) => <EmailField state={state} />}
    </ActionForm>
  );
}
