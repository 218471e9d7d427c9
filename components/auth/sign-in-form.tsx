'use client';

import { signIn } from '@/app/(auth)/actions';
import { ActionForm, EmailField, PasswordField } from './action-form';

export function SignInForm({ next }: { next?: string }) {
  return (
    <ActionForm action={signIn} submit="Sign in" busy="Signing in…" hidden={{ next: next ?? '' }}>
      {(state) => (
        <>
          <EmailField state={state} />
          <PasswordField state={state} isNew={false} />
        </>
      )}
    </ActionForm>
  );
}
