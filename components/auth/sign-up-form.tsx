'use client';

import { signUp } from '@/app/(auth)/actions';
import { TextField } from '@/components/ui/fields';
import { ActionForm, EmailField, NameField, PasswordField } from './action-form';

export function SignUpForm() {
  return (
    <ActionForm action={signUp} submit="Create account" busy="Creating your lab…">
      {(state) => (
        <>
          <NameField state={state} />
          <EmailField state={state} label="Work e-mail" />
          <PasswordField state={state} isNew />
          <TextField
            name="organizationName"
            label="Lab or organization"
            autoComplete="organization"
            required
            defaultValue={state.values?.organizationName}
            hint="You become its admin and can invite your team."
            error={state.fields?.organizationName}
          />
        </>
      )}
    </ActionForm>
  );
}
