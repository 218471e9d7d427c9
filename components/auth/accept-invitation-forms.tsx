'use client';

import {
  acceptInvitationAsMember,
  acceptInvitationWithNewAccount,
} from '@/app/(auth)/account-actions';
import { ActionForm, NameField, PasswordField } from './action-form';

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
          <NameField state={state} />
          <PasswordField state={state} isNew />
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
