'use client';

import { useActionState } from 'react';
import { revokeApiTokenAction } from '@/app/(app)/team/api/actions';
import { initialFormState } from '@/components/auth/form-state';

type Props = {
  id: string;
  name: string;
  scopeLabel: string;
  prefix: string;
  createdBy: string | null;
  expiresOn: string;
  lastUsed: string;
  status: 'active' | 'expired' | 'revoked';
};

export function ApiTokenRow(props: Props) {
  const [state, formAction, pending] = useActionState(revokeApiTokenAction, initialFormState);
  return (
    <tr className="border-b border-ink-100 last:border-0">
      <td className="py-2 pr-4 text-ink-900">{props.name}</td>
      <td className="py-2 pr-4 font-mono text-xs">{props.prefix}…</td>
      <td className="py-2 pr-4">{props.scopeLabel}</td>
      <td className="py-2 pr-4 text-ink-600">{props.createdBy ?? '—'}</td>
      <td className="py-2 pr-4 text-ink-600">{props.lastUsed}</td>
      <td className="py-2 pr-4 text-ink-600">
        {props.status === 'revoked'
          ? 'Revoked'
          : props.status === 'expired'
            ? `Expired ${props.expiresOn}`
            : `Until ${props.expiresOn}`}
      </td>
      <td className="py-2 text-right">
        {props.status === 'active' ? (
          <form action={formAction}>
            <input type="hidden" name="tokenId" value={props.id} />
            <button
              type="submit"
              className="btn-quiet"
              disabled={pending}
              aria-label={`Revoke the token ${props.name}`}
            >
              {pending ? 'Revoking…' : 'Revoke'}
            </button>
          </form>
        ) : null}
        {state.message ? <p className="field-error text-left">{state.message}</p> : null}
      </td>
    </tr>
  );
}
