'use client';

import { useActionState } from 'react';
import { inviteMember } from '@/app/(app)/team/actions';
import { initialFormState } from '@/components/auth/form-state';
import { ROLES, ROLE_LABELS } from '@/lib/auth/permissions';

export function InviteForm() {
  const [state, formAction, pending] = useActionState(inviteMember, initialFormState);
  return (
    <form action={formAction} className="space-y-3" noValidate>
      <div className="grid gap-3 sm:grid-cols-[1fr_12rem]">
        <div>
          <label htmlFor="invite-email" className="field-label">
            E-mail
          </label>
          <input
            id="invite-email"
            name="email"
            type="email"
            autoComplete="off"
            required
            defaultValue={state.notice ? '' : state.values?.email}
            key={state.notice ?? 'form'}
            className="field-input"
            aria-invalid={state.fields?.email ? true : undefined}
            aria-describedby={state.fields?.email ? 'invite-email-error' : undefined}
          />
          {state.fields?.email ? (
            <p id="invite-email-error" className="field-error">
              {state.fields.email}
            </p>
          ) : null}
        </div>
        <div>
          <label htmlFor="invite-role" className="field-label">
            Role
          </label>
          <select
            id="invite-role"
            name="role"
            defaultValue={state.values?.role || 'analyst'}
            className="field-input"
            aria-invalid={state.fields?.role ? true : undefined}
          >
            {ROLES.map((role) => (
              <option key={role} value={role}>
                {ROLE_LABELS[role].name}
              </option>
            ))}
          </select>
          {state.fields?.role ? <p className="field-error">{state.fields.role}</p> : null}
        </div>
      </div>
      {state.message ? (
        <p
          role="alert"
          className="rounded-md border border-coral-100 bg-coral-50 px-3 py-2 text-sm text-coral-900"
        >
          {state.message}
        </p>
      ) : null}
      {state.notice ? (
        <p role="status" className="text-sm text-leaf-700">
          {state.notice}
        </p>
      ) : null}
      <button type="submit" className="btn-primary" disabled={pending}>
        {pending ? 'Sending…' : 'Send invitation'}
      </button>
    </form>
  );
}
