'use client';

import { useActionState } from 'react';
import { initialFormState } from '@/components/auth/form-state';
import type { FormState } from '@/lib/contracts/forms';

type Props = {
  action: (previous: FormState, formData: FormData) => Promise<FormState>;
  field: string;
  value: string;
  label: string;
  busyLabel: string;
  ariaLabel: string;
};

/** One button posting one id to a server action, with the action's answer beside it. */
export function ActionButton(props: Props) {
  const [state, formAction, pending] = useActionState(props.action, initialFormState);
  return (
    <form action={formAction} className="inline">
      <input type="hidden" name={props.field} value={props.value} />
      <button type="submit" className="btn-quiet" disabled={pending} aria-label={props.ariaLabel}>
        {pending ? props.busyLabel : props.label}
      </button>
      {state.message ? <p className="field-error text-left">{state.message}</p> : null}
      {state.notice ? <p className="text-left text-xs text-ink-600">{state.notice}</p> : null}
    </form>
  );
}
