'use client';

import { useActionState, useState } from 'react';
import { changeRoleAction, removeMemberAction } from '@/app/(app)/team/actions';
import { initialFormState } from '@/components/auth/form-state';
import { ROLES, ROLE_LABELS, type Role } from '@/lib/auth/permissions';

type Props = { userId: string; name: string; email: string; role: Role; isYou: boolean };

export function MemberRow({ userId, name, email, role, isYou }: Props) {
  const [roleState, roleAction, rolePending] = useActionState(changeRoleAction, initialFormState);
  const [removeState, removeAction, removePending] = useActionState(
    removeMemberAction,
    initialFormState,
  );
  const [confirming, setConfirming] = useState(false);
  const error = roleState.message ?? roleState.fields?.role ?? removeState.message;
  return (
    <tr className="border-b border-ink-100 align-top last:border-0">
      <td className="py-2 pr-4 font-medium text-ink-900">
        {name}
        {isYou ? <span className="ml-1 text-xs font-normal text-ink-500">(you)</span> : null}
      </td>
      <td className="py-2 pr-4 text-ink-700">{email}</td>
      <td className="py-2 pr-4">
        <form action={roleAction} className="flex items-center gap-2">
          <input type="hidden" name="userId" value={userId} />
          <label htmlFor={`role-${userId}`} className="sr-only">
            Role of {name}
          </label>
          <select
            id={`role-${userId}`}
            name="role"
            defaultValue={role}
            key={role}
            className="field-input mt-0 w-auto py-1"
            title={ROLE_LABELS[role].summary}
          >
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r].name}
              </option>
            ))}
          </select>
          <button type="submit" className="btn-quiet" disabled={rolePending}>
            {rolePending ? 'Saving…' : 'Save role'}
          </button>
        </form>
        {error ? (
          <p role="alert" className="field-error max-w-sm">
            {error}
          </p>
        ) : null}
        {roleState.notice && !error ? (
          <p className="mt-1 text-xs text-leaf-700">{roleState.notice}</p>
        ) : null}
      </td>
      <td className="py-2 text-right">
        {confirming ? (
          <form action={removeAction} className="flex justify-end gap-2">
            <input type="hidden" name="userId" value={userId} />
            <button type="submit" className="btn-primary" disabled={removePending}>
              {removePending ? 'Removing…' : `Remove ${name}`}
            </button>
            <button type="button" className="btn-quiet" onClick={() => setConfirming(false)}>
              Keep
            </button>
          </form>
        ) : (
          <button
            type="button"
            className="btn-quiet"
            onClick={() => setConfirming(true)}
            aria-label={`Remove ${name} from the organization`}
          >
            Remove
          </button>
        )}
      </td>
    </tr>
  );
}
