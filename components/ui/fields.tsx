'use client';

import { useId, useState, type ChangeEvent, type ComponentProps, type ReactNode } from 'react';
import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';

/*
 * The one set of form fields. Each draws its label, its hint and its error, and wires them to
 * the control for screen readers (aria-describedby, aria-invalid). They bind three ways: spread
 * `fieldsOf(form, formId)(name)` for a react-hook-form form, give `name` and `defaultValue` for
 * a server-action form, or `value` and `onChange` for local state.
 */

type Frame = {
  label: ReactNode;
  /** Shown after the label in brackets, e.g. "mN" → "Force (mN)". */
  unit?: string;
  hint?: ReactNode;
  error?: string;
  className?: string;
  id?: string;
};

function useControlIds(id: string | undefined, hint: ReactNode, error: string | undefined) {
  const auto = useId();
  const controlId = id ?? `field${auto.replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const describedBy =
    [error ? `${controlId}-error` : null, hint && !error ? `${controlId}-hint` : null]
      .filter(Boolean)
      .join(' ') || undefined;
  return {
    id: controlId,
    'aria-invalid': error ? (true as const) : undefined,
    'aria-describedby': describedBy,
  };
}

function Hint({ id, hint, error }: { id: string; hint?: ReactNode; error?: string }) {
  if (error)
    return (
      <p id={`${id}-error`} className="field-error" role="alert">
        {error}
      </p>
    );
  if (hint)
    return (
      <p id={`${id}-hint`} className="mt-1 text-xs text-ink-500">
        {hint}
      </p>
    );
  return null;
}

function Label({ id, label, unit }: { id: string; label: ReactNode; unit?: string }) {
  return (
    <label htmlFor={id} className="field-label">
      {label}
      {unit ? <span className="font-normal text-ink-500"> ({unit})</span> : null}
    </label>
  );
}

export function TextField({
  label,
  unit,
  hint,
  error,
  className,
  id,
  ...input
}: Frame & Omit<ComponentProps<'input'>, 'id'>) {
  const control = useControlIds(id, hint, error);
  return (
    <div className={className}>
      <Label id={control.id} label={label} unit={unit} />
      <input {...input} {...control} className="field-input" />
      <Hint id={control.id} hint={hint} error={error} />
    </div>
  );
}

/**
 * A number typed as text (decimal keyboard on phones): what was typed stays as typed, so the
 * server can say what is wrong with it instead of the browser dropping it.
 */
export function NumberField(props: Frame & Omit<ComponentProps<'input'>, 'id' | 'type'>) {
  return <TextField inputMode="decimal" {...props} />;
}

export function TextAreaField({
  label,
  hint,
  error,
  className,
  id,
  rows = 3,
  ...textarea
}: Omit<Frame, 'unit'> & Omit<ComponentProps<'textarea'>, 'id'>) {
  const control = useControlIds(id, hint, error);
  return (
    <div className={className}>
      <Label id={control.id} label={label} />
      <textarea rows={rows} {...textarea} {...control} className="field-input" />
      <Hint id={control.id} hint={hint} error={error} />
    </div>
  );
}

export type Choice = { value: string; label: string };

export function SelectField({
  label,
  hint,
  error,
  className,
  id,
  options = [],
  placeholder,
  children,
  ...select
}: Omit<Frame, 'unit'> &
  Omit<ComponentProps<'select'>, 'id'> & {
    options?: readonly Choice[];
    /** A first, empty choice ("Choose a …"). */
    placeholder?: string;
  }) {
  const control = useControlIds(id, hint, error);
  return (
    <div className={className}>
      <Label id={control.id} label={label} />
      <select {...select} {...control} className="field-input">
        {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
        {children}
      </select>
      <Hint id={control.id} hint={hint} error={error} />
    </div>
  );
}

export function CheckboxField({
  label,
  hint,
  error,
  className,
  id,
  ...input
}: Omit<Frame, 'unit'> & Omit<ComponentProps<'input'>, 'id' | 'type'>) {
  const control = useControlIds(id, hint, error);
  return (
    <div className={className}>
      <label htmlFor={control.id} className="flex items-start gap-2 text-sm">
        <input type="checkbox" className="mt-1" {...input} {...control} />
        <span>{label}</span>
      </label>
      <Hint id={control.id} hint={hint} error={error} />
    </div>
  );
}

type FieldElement = HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement;

/**
 * A field's text held in local state: `[value, setValue, bind]`, where `bind` is the `value` and
 * `onChange` to spread on the field.
 */
export function useFieldState(initial: string | (() => string)) {
  const [value, setValue] = useState(initial);
  const bind = {
    value,
    onChange: (event: ChangeEvent<FieldElement>) => setValue(event.target.value),
  };
  return [value, setValue, bind] as const;
}

/** The error of a (possibly nested, dotted) field of a react-hook-form form. */
export function fieldError<V extends FieldValues>(
  form: UseFormReturn<V>,
  name: string,
): string | undefined {
  let node: unknown = form.formState.errors;
  for (const part of name.split('.')) {
    if (!node || typeof node !== 'object') return undefined;
    node = (node as Record<string, unknown>)[part];
  }
  const message = (node as { message?: unknown } | undefined)?.message;
  return typeof message === 'string' ? message : undefined;
}

/**
 * Binds fields to a react-hook-form form: `<TextField label="Code" {...field('code')} />` gets
 * its registration, an id unique on the page (`formId-name`) and its error.
 */
export function fieldsOf<V extends FieldValues>(form: UseFormReturn<V>, formId: string) {
  return (name: Path<V> | (string & {})) => ({
    id: `${formId}-${name.replace(/\./g, '-')}`,
    error: fieldError(form, name),
    ...form.register(name as Path<V>),
  });
}

/** A message above a form: the server's answer, or a summary of what went wrong. */
export function FormNotice({
  tone,
  children,
}: {
  tone: 'error' | 'success' | 'warning';
  children: ReactNode;
}) {
  const styles = {
    error: 'border-coral-500 bg-coral-50 text-coral-900',
    success: 'border-leaf-500 bg-leaf-50 text-leaf-900',
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
