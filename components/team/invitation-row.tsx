'use client';

import { useActionState } from 'react';
import { revokeInvitationAction } from '@/app/(app)/team/actions';
import { initialFormState } from '@/components/auth/form-state';

type Props = {
  id: string;
  email: string;
  roleName: string;
  invitedBy: string | null;
  expiresOn: string;
  expired: boolean;
};

export function InvitationRow({ id, email, roleName, invitedBy, expiresOn, expired }: Props) {
  const [state, formAction, pending] = useActionState(revokeInvitationAction, initialFormState);
  return (
    <tr className="border-b border-ink-100 last:border-0">
      <td className="py-2 pr-4 text-ink-900">{email}</td>
      <td className="py-2 pr-4">{roleName}</td>
      <td className="py-2 pr-4 text-ink-600">{invitedBy ?? '—'}</td>
      <td className="py-2 pr-4 text-ink-600">
        {expired ? `Expired ${expiresOn}` : `Until ${expiresOn}`}
      </td>
      <td className="py-2 text-right">
        <form action={formAction}>
          <input type="hidden" name="invitationId" value={id} />
          <button
            type="submit"
            className="btn-quiet"
            disabled={pending}
            aria-label={`Revoke the invitation to ${email}`}
          >
            {pending ? 'Revoking…' : expired ? 'Remove' : 'Revoke'}
          </button>
        </form>
        {state.message ? <p className="field-error text-left">{state.message}</p> : null}
      </td>
    </tr>
  );
}
