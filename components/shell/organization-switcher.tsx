'use client';

import { useState, useTransition } from 'react';
import { switchOrganization } from '@/app/(app)/actions';

type Option = { organizationId: string; organizationName: string; role: string };

export function OrganizationSwitcher({ options, activeId }: { options: Option[]; activeId: string }) {
  const [pending, startTransition] = useTransition();
  const [error, setError] = useState<string | null>(null);
  if (options.length < 2) {
    return <p className="truncate text-sm font-medium text-ink-900">{options[0]?.organizationName}</p>;
  }
  return (
    <div>
      <label htmlFor="organization-switcher" className="sr-only">
        Organization
      </label>
      <select
        id="organization-switcher"
        defaultValue={activeId}
        disabled={pending}
        className="field-input mt-0"
        onChange={(event) => {
          const formData = new FormData();
          formData.set('organizationId', event.target.value);
          startTransition(async () => {
            const result = await switchOrganization(formData);
            setError(result.ok ? null : result.error.message);
          });
        }}
      >
        {options.map((option) => (
          <option key={option.organizationId} value={option.organizationId}>
            {option.organizationName}
          </option>
        ))}
      </select>
      {error ? <p className="field-error">{error}</p> : null}
    </div>
  );
}
