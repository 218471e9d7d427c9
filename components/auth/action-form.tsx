'use client';

import { useActionState, type ReactNode } from 'react';
import { FormNotice, TextField } from '@/components/ui/fields';
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
 * button that says when it is busy. With `endsWithNotice`, a notice is the last word: the form
 * gives way to it.
 */
export function ActionForm({
  action,
  submit,
  busy,
  hidden = {},
  endsWithNotice = false,
  children,
}: {
  action: Action;
  submit: string;
  busy: string;
  hidden?: Record<string, string>;
  endsWithNotice?: boolean;
  children?: (state: FormState) => ReactNode;
}) {
  const [state, formAction, pending] = useActionState(action, initialFormState);
  if (endsWithNotice && state.notice) return <FormMessages state={state} />;
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

/**
 * Binds a field to a server-action form's answer: its name, its error and what was typed (kept
 * when the form comes back). `fallback` is the value before anything was typed; with
 * `clearOnNotice`, a notice (a success) empties the field for the next entry.
 */
export function answerField(
  state: FormState,
  name: string,
  options: { fallback?: string; clearOnNotice?: boolean } = {},
) {
  return {
    name,
    defaultValue:
      options.clearOnNotice && state.notice ? '' : (state.values?.[name] ?? options.fallback),
    error: state.fields?.[name],
  };
}

/** A field that shows a secret once, right after it is made; focusing it selects it to copy. */
export function ShownOnceField({ id, label, value }: { id: string; label: string; value: string }) {
  return (
    <TextField
      id={id}
      label={label}
      readOnly
      value={value}
      className="font-mono"
      onFocus={(event) => event.currentTarget.select()}
    />
  );
}

/** The e-mail address, kept as typed when the form comes back. */
export function EmailField({ state, label = 'E-mail' }: { state: FormState; label?: string }) {
  return (
    <TextField
      label={label}
      type="email"
      autoComplete="email"
      required
      {...answerField(state, 'email')}
    />
  );
}

export function NameField({ state }: { state: FormState }) {
  return (
    <TextField label="Your name" autoComplete="name" required {...answerField(state, 'name')} />
  );
}

/** A password: the current one to sign in, or a new one with its rule beside it. */
export function PasswordField({
  state,
  label = 'Password',
  isNew,
}: {
  state: FormState;
  label?: string;
  isNew: boolean;
}) {
  return (
    <TextField
      name="password"
      label={label}
      type="password"
      autoComplete={isNew ? 'new-password' : 'current-password'}
      required
      hint={isNew ? 'At least 10 characters.' : undefined}
      // A reset link that no longer works is reported on the password it would have set.
      error={state.fields?.password ?? state.fields?.token}
    />
  );
}
