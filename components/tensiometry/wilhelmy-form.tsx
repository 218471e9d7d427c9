'use client';

import { useState } from 'react';
import type { SavedTensiometry } from '@/components/data/resources';
import { DefinitionList } from '@/components/ui/definition-list';
import { fmt } from '@/components/ui/format';
import type { WilhelmyContactAngleResult, WilhelmySurfaceTensionResult } from '@/lib/tensiometry';
import { CalculationForm, NumberInputs, type NumberInput } from './calculation-form';
import { toNumbers, useCalculation } from './use-calculation';

export type WilhelmyMode = 'tension' | 'angle';
type Reply = {
  result: WilhelmySurfaceTensionResult | WilhelmyContactAngleResult;
  saved?: SavedTensiometry;
};

type Field =
  | 'forceMilliNewton'
  | 'plateWidthMm'
  | 'plateThicknessMm'
  | 'immersionDepthMm'
  | 'liquidDensityGPerCm3'
  | 'liquidSurfaceTensionMilliNewtonPerM';

const INPUTS: NumberInput<Field>[] = [
  { key: 'forceMilliNewton', label: 'Force', unit: 'mN' },
  { key: 'plateWidthMm', label: 'Plate width w', unit: 'mm' },
  { key: 'plateThicknessMm', label: 'Plate thickness t', unit: 'mm' },
  {
    key: 'immersionDepthMm',
    label: 'Immersion depth d',
    unit: 'mm',
    hint: '0 when the plate just touches the surface.',
  },
  {
    key: 'liquidDensityGPerCm3',
    label: 'Liquid density ρ',
    unit: 'g/cm³',
    hint: 'Needed for the buoyancy correction when d > 0.',
  },
];
const SURFACE_TENSION_INPUT: NumberInput<Field> = {
  key: 'liquidSurfaceTensionMilliNewtonPerM',
  label: 'Liquid surface tension γ',
  unit: 'mN/m',
};

const MODES: { mode: WilhelmyMode; label: string }[] = [
  { mode: 'tension', label: 'Surface tension of the liquid (platinum plate, θ = 0)' },
  { mode: 'angle', label: 'Contact angle on a plate of another material (γ known)' },
];

/**
 * Wilhelmy plate: the surface tension of a liquid (platinum plate, θ = 0), or the contact angle
 * on a plate of another material when γ is known. Switching what is computed clears the answer
 * shown, which belonged to the other question.
 */
export function WilhelmyForm({
  canSave,
  onSaved,
}: {
  canSave: boolean;
  onSaved: (s: SavedTensiometry) => void;
}) {
  const [mode, setMode] = useState<WilhelmyMode>('tension');
  const calc = useCalculation<
    | 'forceMilliNewton'
    | 'plateWidthMm'
    | 'plateThicknessMm'
    | 'immersionDepthMm'
    | 'liquidDensityGPerCm3'
    | 'liquidSurfaceTensionMilliNewtonPerM',
    Reply
  >({
    url: '/api/tensiometry/wilhelmy',
    initial: {
      forceMilliNewton: '',
      plateWidthMm: '19.62',
      plateThicknessMm: '0.10',
      immersionDepthMm: '0',
      liquidDensityGPerCm3: '',
      liquidSurfaceTensionMilliNewtonPerM: '',
    },
    onSaved,
  });
  function switchTo(next: WilhelmyMode) {
    setMode(next);
    calc.clear();
  }

  function send(save: boolean) {
    const { liquidSurfaceTensionMilliNewtonPerM, ...common } = calc.values;
    const body = toNumbers(
      mode === 'angle' ? { ...common, liquidSurfaceTensionMilliNewtonPerM } : common,
      ['liquidDensityGPerCm3', 'immersionDepthMm'],
    );
    void calc.submit({ mode, ...body, save });
  }

  const result = calc.reply?.result;
  return (
    <section className="card" aria-label="Wilhelmy plate">
      <h2 className="mb-1">Wilhelmy plate</h2>
      <p className="mb-3 text-xs text-ink-600">
        γ · 2(w + t) · cos θ = F − W + ρ g w t d (Wilhelmy 1863). Balance tared with the plate
        hanging in air.
      </p>
      <CalculationForm
        onSend={send}
        busy={calc.busy}
        canSave={canSave}
        labels={{ run: 'Compute', running: 'Computing…', save: 'Compute and save' }}
        message={calc.message}
      >
        <fieldset className="flex flex-wrap gap-4 text-sm">
          <legend className="field-label mb-1">Compute</legend>
          {MODES.map((choice) => (
            <label key={choice.mode} className="flex items-center gap-2">
              <input
                type="radio"
                name="wilhelmy-mode"
                checked={mode === choice.mode}
                onChange={() => switchTo(choice.mode)}
              />
              {choice.label}
            </label>
          ))}
        </fieldset>
        <NumberInputs
          className="grid gap-4 sm:grid-cols-2"
          bind={calc.bind}
          inputs={mode === 'angle' ? [...INPUTS, SURFACE_TENSION_INPUT] : INPUTS}
        />
      </CalculationForm>
      {result ? (
        <div aria-live="polite">
          <DefinitionList
            testId="wilhelmy-result"
            className="mt-4 rounded-md bg-lagoon-50 p-3 text-sm"
            items={[
              'surfaceTensionMilliNewtonPerM' in result
                ? {
                    term: 'Surface tension γ',
                    value: `${fmt(result.surfaceTensionMilliNewtonPerM, 2)} mN/m (θ = ${fmt(result.contactAngleDeg, 0)}°)`,
                  }
                : {
                    term: 'Contact angle θ',
                    value: `${fmt(result.contactAngleDeg, 1)}° (cos θ = ${fmt(result.cosTheta, 4)})`,
                  },
              {
                term: 'Wetted perimeter 2(w + t)',
                value: `${fmt(result.wettedPerimeterMm, 3)} mm`,
              },
              {
                term: 'Buoyancy correction ρ g w t d (added)',
                value: `${fmt(result.buoyancyMilliNewton, 4)} mN`,
              },
              {
                term: 'Corrected wetting force',
                value: `${fmt(result.wettingForceMilliNewton, 4)} mN`,
              },
            ]}
          />
        </div>
      ) : null}
    </section>
  );
}
