'use client';

import { signUp } from '@/app/(auth)/actions';
import { TextField } from '@/components/ui/fields';
import { ActionForm, NEW_PASSWORD_HINT } from './action-form';

export function SignUpForm() {
  return (
    <ActionForm action={signUp} submit="Create account" busy="Creating your lab…">
      {(state) => (
        <>
          <TextField
            name="name"
            label="Your name"
            autoComplete="name"
            required
            defaultValue={state.values?.name}
            error={state.fields?.name}
          />
          <TextField
            name="email"
            label="Work e-mail"
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
            autoComplete="new-password"
            required
            hint={NEW_PASSWORD_HINT}
            error={state.fields?.password}
          />
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
