'use client';

import { useActionState, type ReactNode } from 'react';
import { FormNotice } from '@/components/ui/fields';
import { initialFormState, type FormState } from './form-state';

type Action = (previous: FormState, formData: FormData) => Promise<FormState>;

/** The error (role=alert) and the calm notice (role=status) of a server-action form. */
export function FormMessages({ state }: { state: FormState }) {
  return (
    <>
      {state.message ? <FormNotice tone="error">{state.message}</FormNotice> : null}
      {state.notice ? <FormNotice tone="success">{state.notice}</FormNotice> : null}
    </>
  );
}

/**
 * A form posted to a server action: its answer's messages on top, the fields (given the
 * answer, to show field errors and keep what was typed), hidden values and one full-width
 * button that says when it is busy.
 */
export function ActionForm({
  action,
  submit,
  busy,
  hidden = {},
  children,
}: {
  action: Action;
  submit: string;
  busy: string;
  hidden?: Record<string, string>;
  children?: (state: FormState) => ReactNode;
}) {
  const [state, formAction, pending] = useActionState(action, initialFormState);
  return (
    <form action={formAction} className="space-y-4" noValidate>
      <FormMessages state={state} />
      {Object.entries(hidden).map(([name, value]) => (
        <input key={name} type="hidden" name={name} value={value} />
      ))}
      {children?.(state)}
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? busy : submit}
      </button>
    </form>
  );
}

/** A new password with the rule next to it. */
export const NEW_PASSWORD_HINT = 'At least 10 characters.';
