'use client';

import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';

type Common<V extends FieldValues> = {
  form: UseFormReturn<V>;
  name: Path<V>;
  label: string;
  hint?: string;
  className?: string;
};

function errorOf<V extends FieldValues>(form: UseFormReturn<V>, name: string): string | undefined {
  let node: unknown = form.formState.errors;
  for (const part of name.split('.')) {
    if (!node || typeof node !== 'object') return undefined;
    node = (node as Record<string, unknown>)[part];
  }
  const message = (node as { message?: unknown } | undefined)?.message;
  return typeof message === 'string' ? message : undefined;
}

function Shell({
  id,
  label,
  hint,
  error,
  className,
  children,
}: {
  id: string;
  label: string;
  hint?: string;
  error?: string;
  className?: string;
  children: React.ReactNode;
}) {
  return (
    <div className={className}>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      {children}
      {hint && !error ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-500">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="field-error" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

const idOf = (formId: string, name: string) => `${formId}-${name.replace(/\./g, '-')}`;
const describedBy = (id: string, error?: string, hint?: string) =>
  [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;

/** A labelled input registered with react-hook-form, showing its error (client or server). */
export function InputField<V extends FieldValues>({
  form,
  name,
  label,
  hint,
  className,
  formId,
  ...input
}: Common<V> & { formId: string } & Omit<
    React.InputHTMLAttributes<HTMLInputElement>,
    'name' | 'form'
  >) {
  const id = idOf(formId, name);
  const error = errorOf(form, name);
  return (
    <Shell id={id} label={label} hint={hint} error={error} className={className}>
      <input
        id={id}
        {...input}
        {...form.register(name)}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        className="field-input"
      />
    </Shell>
  );
}

export function TextAreaField<V extends FieldValues>({
  form,
  name,
  label,
  hint,
  className,
  formId,
  rows = 3,
}: Common<V> & { formId: string; rows?: number }) {
  const id = idOf(formId, name);
  const error = errorOf(form, name);
  return (
    <Shell id={id} label={label} hint={hint} error={error} className={className}>
      <textarea
        id={id}
        rows={rows}
        {...form.register(name)}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        className="field-input"
      />
    </Shell>
  );
}

export function SelectField<V extends FieldValues>({
  form,
  name,
  label,
  hint,
  className,
  formId,
  options,
  placeholder,
}: Common<V> & {
  formId: string;
  options: { value: string; label: string }[];
  placeholder?: string;
}) {
  const id = idOf(formId, name);
  const error = errorOf(form, name);
  return (
    <Shell id={id} label={label} hint={hint} error={error} className={className}>
      <select
        id={id}
        {...form.register(name)}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        className="field-input"
      >
        {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
    </Shell>
  );
}

/** A message above the form: the server's answer, or a summary of what went wrong. */
export function FormNotice({
  tone,
  children,
}: {
  tone: 'error' | 'success' | 'warning';
  children: React.ReactNode;
}) {
  const styles = {
    error: 'border-coral-500 bg-coral-50 text-coral-900',
    success: 'border-lagoon-600 bg-white text-ink-900',
    warning: 'border-amber-500 bg-amber-50 text-amber-900',
  }[tone];
  return (
    <div
      role={tone === 'error' ? 'alert' : 'status'}
      className={`rounded-md border px-3 py-2 text-sm ${styles}`}
    >
      {children}
    </div>
  );
}
