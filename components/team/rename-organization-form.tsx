'use client';

import { useActionState } from 'react';
import { renameOrganization } from '@/app/(app)/actions';
import { TextField } from '@/components/ui/fields';

export function RenameOrganizationForm({ currentName }: { currentName: string }) {
  const [state, formAction, pending] = useActionState(renameOrganization, null);
  const error = state && !state.ok ? state.error : null;
  return (
    <form action={formAction} className="flex flex-col gap-3 sm:flex-row sm:items-start">
      <TextField
        id="organization-name"
        name="name"
        label="Name"
        className="flex-1"
        defaultValue={currentName}
        error={error ? (error.fields?.name ?? error.message) : undefined}
      />
      <button type="submit" className="btn-primary sm:mt-6" disabled={pending}>
        {pending ? 'Saving…' : 'Rename'}
      </button>
      {state?.ok ? (
        <p role="status" className="text-sm text-leaf-700 sm:basis-full">
          Saved.
        </p>
      ) : null}
    </form>
  );
}
