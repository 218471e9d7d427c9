'use client';

import { useActionState } from 'react';
import {
  acceptInvitationAsMember,
  acceptInvitationWithNewAccount,
} from '@/app/(auth)/account-actions';
import { Field } from './field';
import { FormMessages } from './form-messages';
import { initialFormState } from './form-state';

/** A signed-out person without an account: their name and a password. */
export function AcceptWithNewAccountForm({ token, email }: { token: string; email: string }) {
  const [state, formAction, pending] = useActionState(
    acceptInvitationWithNewAccount,
    initialFormState,
  );
  return (
    <form action={formAction} className="space-y-4" noValidate>
      <FormMessages state={state} />
      <input type="hidden" name="token" value={token} />
      <div>
        <span className="field-label">E-mail</span>
        <p className="mt-1 text-sm text-ink-900">{email}</p>
      </div>
      <Field
        name="name"
        label="Your name"
        autoComplete="name"
        defaultValue={state.values?.name}
        error={state.fields?.name}
      />
      <Field
        name="password"
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={state.fields?.password}
      />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? 'Joining…' : 'Create account and join'}
      </button>
    </form>
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
  const [state, formAction, pending] = useActionState(acceptInvitationAsMember, initialFormState);
  return (
    <form action={formAction} className="space-y-4">
      <FormMessages state={state} />
      <input type="hidden" name="token" value={token} />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? 'Joining…' : `Join ${organizationName}`}
      </button>
    </form>
  );
}
