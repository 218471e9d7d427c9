'use client';

import { signUp } from '@/app/(auth)/actions';
import { TextField } from '@/components/ui/fields';
import { ActionForm, EmailField, NameField, PasswordField, answerField } from './action-form';

export function SignUpForm() {
  return (
    // Sent: the same words whether or not the address already had an account.
    <ActionForm action={signUp} submit="Create account" busy="Sending…" endsWithNotice>
      {(state) => (
        <>
          <NameField state={state} />
          <EmailField state={state} label="Work e-mail" />
          <PasswordField state={state} isNew />
          <TextField
            label="Lab or organization"
            autoComplete="organization"
            required
            hint="You become its admin and can invite your team."
            {...answerField(state, 'organizationName')}
          />
        </>
      )}
    </ActionForm>
  );
}
