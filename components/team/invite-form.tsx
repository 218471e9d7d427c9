'use client';

import { useActionState } from 'react';
import { inviteMember } from '@/app/(app)/team/actions';
import { answerField, FormMessages } from '@/components/auth/action-form';
import { initialFormState } from '@/components/auth/form-state';
import { SelectField, TextField } from '@/components/ui/fields';
import { ROLES, ROLE_LABELS } from '@/lib/auth/permissions';

const ROLE_CHOICES = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role].name }));

export function InviteForm() {
  const [state, formAction, pending] = useActionState(inviteMember, initialFormState);
  return (
    <form action={formAction} className="space-y-3" noValidate>
      <div className="grid gap-3 sm:grid-cols-[1fr_12rem]">
        <TextField
          id="invite-email"
          label="E-mail"
          type="email"
          autoComplete="off"
          required
          // A sent invitation empties the box for the next one.
          key={state.notice ?? 'form'}
          {...answerField(state, 'email', { clearOnNotice: true })}
        />
        <SelectField
          id="invite-role"
          label="Role"
          options={ROLE_CHOICES}
          {...answerField(state, 'role', { fallback: 'analyst' })}
        />
      </div>
      <FormMessages state={state} />
      <button type="submit" className="btn-primary" disabled={pending}>
        {pending ? 'Sending…' : 'Send invitation'}
      </button>
    </form>
  );
}
