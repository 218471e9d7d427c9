'use client';

import type { SavedTensiometry } from '@/components/data/resources';
import { DefinitionList } from '@/components/ui/definition-list';
import { fmt } from '@/components/ui/format';
import type { ProbeLiquidCheck } from '@/lib/tensiometry';
import { CalculationForm, NumberInputs, type NumberInput } from './calculation-form';
import { FLAG_TEXT } from './labels';
import { toNumbers, useCalculation } from './use-calculation';


type Field = 'measuredMilliNewtonPerM' | 'temperatureC' | 'toleranceMilliNewtonPerM';

const INPUTS: NumberInput<Field>[] = [
  { key: 'measuredMilliNewtonPerM', label: 'Measured γ', unit: 'mN/m' },
  { key: 'temperatureC', label: 'Temperature', unit: '°C' },
  { key: 'toleranceMilliNewtonPerM', label: 'Tolerance', unit: '± mN/m', hint: 'Set by your lab.' },
];

/** The probe water's measured surface tension against IAPWS R1-76(2014) at its temperature. */
export function WaterCheckForm({
  canSave,
  onSaved,
}: {
  canSave: boolean;
  onSaved: (s: SavedTensiometry) => void;
}) {
  const calc = useCalculation<Field, { result: ProbeLiquidCheck; saved?: SavedTensiometry }>({
    url: '/api/tensiometry/water-check',
    initial: { measuredMilliNewtonPerM: '', temperatureC: '20', toleranceMilliNewtonPerM: '1.0' },
    onSaved,
  });
  const { values, bind } = calc;
  const result = calc.reply?.result;
  return (
    <section className="card" aria-label="Water check">
      <h2 className="mb-1">Probe water check</h2>
      <p className="mb-3 text-xs text-ink-600">
        Measured water surface tension against IAPWS R1-76(2014) at the measured temperature. A low
        value usually means surface-active contamination of the water or the vessel.
      </p>
      <CalculationForm
        onSend={(save) => void calc.submit({ ...toNumbers(values), save })}
        busy={calc.busy}
        canSave={canSave}
        labels={{ run: 'Check', running: 'Checking…', save: 'Check and save' }}
        message={calc.message}
      >
        <NumberInputs className="grid gap-4 sm:grid-cols-3" bind={bind} inputs={INPUTS} />
      </CalculationForm>
      {result ? (
        <div className="mt-4 grid gap-2" data-testid="water-check-result" aria-live="polite">
          <DefinitionList
            className="text-sm"
            items={[
              {
                term: `IAPWS R1-76(2014) at ${values.temperatureC} °C`,
                value: `${fmt(result.referenceMilliNewtonPerM, 2)} mN/m`,
                testId: 'water-reference',
              },
              {
                term: 'Difference (measured − reference)',
                value: `${result.deviationMilliNewtonPerM >= 0 ? '+' : ''}${fmt(result.deviationMilliNewtonPerM, 2)} mN/m`,
              },
            ]}
          />
          <p
            className={`rounded-md px-3 py-2 text-sm ${FLAG_TEXT[result.flag].tone}`}
            data-testid="water-flag"
          >
            <strong>{FLAG_TEXT[result.flag].label}.</strong> {result.message}
          </p>
        </div>
      ) : null}
    </section>
  );
}
