'use client';

import { signIn } from '@/app/(auth)/actions';
import { TextField } from '@/components/ui/fields';
import { ActionForm } from './action-form';

export function SignInForm({ next }: { next?: string }) {
  return (
    <ActionForm action={signIn} submit="Sign in" busy="Signing in…" hidden={{ next: next ?? '' }}>
      {(state) => (
        <>
          <TextField
            name="email"
            label="E-mail"
            type="email"
            autoComplete="email"
            required
            defaultValue={state.values?.email}
            error={state.fields?.email}
          />
          <TextField
            name="password"
            label="Password"
            type="password"
            autoComplete="current-password"
            required
            error={state.fields?.password}
          />
        </>
      )}
    </ActionForm>
  );
}
