'use client';

import { useActionState } from 'react';
import { createApiTokenAction } from '@/app/(app)/team/api/actions';
import { answerField, FormMessages, ShownOnceField } from '@/components/auth/action-form';
import { initialFormState } from '@/components/auth/form-state';
import { NumberField, SelectField, TextField } from '@/components/ui/fields';
import { API_TOKEN_SCOPES, API_TOKEN_SCOPE_LABELS } from '@/lib/auth/permissions';

const SCOPE_CHOICES = API_TOKEN_SCOPES.map((scope) => ({
  value: scope,
  label: API_TOKEN_SCOPE_LABELS[scope],
}));

/** Makes a token; the token itself is shown once, right here, after it is made. */
export function ApiTokenForm() {
  const [state, formAction, pending] = useActionState(createApiTokenAction, initialFormState);
  const token = state.notice ? state.values?.token : undefined;
  return (
    <form action={formAction} className="space-y-3" noValidate>
      <div className="grid gap-3 sm:grid-cols-[1fr_16rem_8rem]">
        <TextField
          id="api-token-name"
          label="Name"
          hint="The instrument or system, e.g. Stage 2 camera PC"
          autoComplete="off"
          key={state.notice ?? 'form'}
          {...answerField(state, 'name', { clearOnNotice: true })}
        />
        <SelectField
          id="api-token-scope"
          label="Scope"
          options={SCOPE_CHOICES}
          {...answerField(state, 'scope', { fallback: 'read-measure' })}
        />
        <NumberField
          id="api-token-days"
          label="Works for"
          unit="days"
          {...answerField(state, 'expiresInDays', { fallback: '365' })}
        />
      </div>
      <FormMessages state={state} />
      {token ? <ShownOnceField id="api-token-value" label="The new token" value={token} /> : null}
      <button type="submit" className="btn-primary" disabled={pending}>
        {pending ? 'Making…' : 'Make token'}
      </button>
    </form>
  );
}
