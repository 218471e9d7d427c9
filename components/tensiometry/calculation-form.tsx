'use client';

import type { ReactNode } from 'react';
import { NumberField } from '@/components/ui/fields';

/**
 * The frame of a tensiometry form: the inputs, a button that computes and one that computes
 * and saves (for those who may save), and the answer's error.
 */
export function CalculationForm({
  onSend,
  busy,
  disabled = false,
  canSave,
  labels,
  message,
  children,
}: {
  onSend: (save: boolean) => void;
  busy: boolean;
  disabled?: boolean;
  canSave: boolean;
  labels: { run: string; running: string; save: string };
  message: string | null;
  children: ReactNode;
}) {
  return (
    <form
      noValidate
      onSubmit={(event) => {
        event.preventDefault();
        onSend(false);
      }}
      className="grid gap-4"
    >
      {children}
      <div className="flex flex-wrap gap-3">
        <button type="submit" className="btn-primary" disabled={busy || disabled}>
          {busy ? labels.running : labels.run}
        </button>
        {canSave ? (
          <button
            type="button"
            className="btn-quiet"
            disabled={busy || disabled}
            onClick={() => onSend(true)}
          >
            {labels.save}
          </button>
        ) : null}
      </div>
      {message ? (
        <p role="alert" className="field-error">
          {message}
        </p>
      ) : null}
    </form>
  );
}

export type NumberInput<Field extends string> = {
  key: Field;
  label: string;
  unit: string;
  hint?: string;
};

/** The number inputs of a form, each bound by `bind` (see useCalculation). */
export function NumberInputs<Field extends string>({
  inputs,
  bind,
  className,
}: {
  inputs: NumberInput<Field>[];
  bind: (key: Field) => object;
  className: string;
}) {
  return (
    <div className={className}>
      {inputs.map((input) => (
        <NumberField
          key={input.key}
          label={input.label}
          unit={input.unit}
          hint={input.hint}
          {...bind(input.key)}
        />
      ))}
    </div>
  );
}
