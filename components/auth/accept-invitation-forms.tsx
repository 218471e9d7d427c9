'use client';

import {
  acceptInvitationAsMember,
  acceptInvitationWithNewAccount,
} from '@/app/(auth)/account-actions';
import { TextField } from '@/components/ui/fields';
import { ActionForm, NEW_PASSWORD_HINT } from './action-form';

/** A signed-out person without an account: their name and a password. */
export function AcceptWithNewAccountForm({ token, email }: { token: string; email: string }) {
  return (
    <ActionForm
      action={acceptInvitationWithNewAccount}
      submit="Create account and join"
      busy="Joining…"
      hidden={{ token }}
    >
      {(state) => (
        <>
          <div>
            <span className="field-label">E-mail</span>
            <p className="mt-1 text-sm text-ink-900">{email}</p>
          </div>
          <TextField
            name="name"
            label="Your name"
            autoComplete="name"
            required
            defaultValue={state.values?.name}
            error={state.fields?.name}
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
        </>
      )}
    </ActionForm>
  );
}

/** A signed-in user whose e-mail matches: one button. */
export function AcceptAsMemberForm({
  token,
  organizationName,
}: {
  token: string;
  organizationName: string;
}) {
  return (
    <ActionForm
      action={acceptInvitationAsMember}
      submit={`Join ${organizationName}`}
      busy="Joining…"
      hidden={{ token }}
    />
  );
}
