'use client';

import { useActionState } from 'react';
import { renameOrganization } from '@/app/(app)/actions';

export function RenameOrganizationForm({ currentName }: { currentName: string }) {
  const [state, formAction, pending] = useActionState(renameOrganization, null);
  const error = state && !state.ok ? state.error : null;
  return (
    <form action={formAction} className="flex flex-col gap-3 sm:flex-row sm:items-end">
      <div className="flex-1">
        <label htmlFor="organization-name" className="field-label">
          Name
        </label>
        <input
          id="organization-name"
          name="name"
          defaultValue={currentName}
          className="field-input"
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? 'organization-name-error' : undefined}
        />
      </div>
      <button type="submit" className="btn-primary" disabled={pending}>
        {pending ? 'Saving…' : 'Rename'}
      </button>
      <p aria-live="polite" className="text-sm sm:hidden" />
      {error ? (
        <p id="organization-name-error" className="field-error sm:basis-full">
          {error.fields?.name ?? error.message}
        </p>
      ) : null}
      {state?.ok ? <p className="text-sm text-leaf-700 sm:basis-full">Saved.</p> : null}
    </form>
  );
}
