'use client';

import { CheckboxField, SelectField } from '@/components/ui/fields';
import {
  SURFACE_ENERGY_METHOD_KEYS,
  type MethodAvailability,
  type UncertaintyBasis,
} from '@/lib/surface-energy/compute';
import { METHOD_LABELS } from './labels';
import type { MethodChoice } from './use-surface-energy';

/**
 * Which surface-energy methods to run and what the uncertainty describes. A method the
 * measured liquids do not allow is disabled with the reason beside it.
 */
export function MethodPicker({
  kind,
  availability,
  choice,
  onChoose,
  computing,
  error,
}: {
  kind: 'sample' | 'batch';
  availability: MethodAvailability[];
  choice: MethodChoice;
  onChoose: (next: MethodChoice) => void;
  computing: boolean;
  error: string | null;
}) {
  return (
    <section className="card" aria-label="Methods">
      <h2 className="mb-2">Methods</h2>
      <fieldset>
        <legend className="sr-only">Surface-energy methods</legend>
        <ul className="grid gap-2 sm:grid-cols-2">
          {SURFACE_ENERGY_METHOD_KEYS.map((method) => {
            const check = availability.find((a) => a.method === method);
            return (
              <li key={method}>
                <CheckboxField
                  id={`se-method-${method}`}
                  label={
                    <span className={check?.available ? 'text-ink-900' : 'text-ink-500'}>
                      {METHOD_LABELS[method]}
                    </span>
                  }
                  hint={check?.available ? undefined : check?.reason}
                  checked={choice.methods.includes(method)}
                  disabled={!check?.available || computing}
                  onChange={(event) =>
                    onChoose({
                      ...choice,
                      methods: event.target.checked
                        ? [...choice.methods, method]
                        : choice.methods.filter((m) => m !== method),
                    })
                  }
                />
              </li>
            );
          })}
        </ul>
      </fieldset>
      <SelectField
        id="se-basis"
        className="mt-3 max-w-sm"
        label="Uncertainty of"
        value={choice.basis}
        disabled={computing}
        onChange={(event) => onChoose({ ...choice, basis: event.target.value as UncertaintyBasis })}
        options={[
          { value: 'mean', label: `the ${kind}’s value (standard error of each mean angle)` },
          { value: 'single', label: 'single drops (SD of the angles)' },
        ]}
      />
      {error ? (
        <p role="alert" className="field-error">
          {error}
        </p>
      ) : null}
      {computing ? (
        <p className="mt-2 text-sm text-ink-600" aria-live="polite">
          Computing…
        </p>
      ) : null}
    </section>
  );
}
