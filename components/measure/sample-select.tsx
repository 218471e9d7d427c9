'use client';

import { useMemo, type ComponentProps } from 'react';
import { SelectField } from '@/components/ui/fields';
import type { LiquidChoice, SampleChoice } from './types';

/** A sample picker grouped by coating ("lot / sample"); with no samples, it says how to add one. */
export function SampleSelect({
  samples,
  hint,
  ...field
}: { samples: SampleChoice[] } & Omit<ComponentProps<typeof SelectField>, 'options'>) {
  const byCoating = useMemo(() => {
    const groups = new Map<string, SampleChoice[]>();
    for (const s of samples) {
      const key = `${s.coatingCode} · ${s.coatingName}`;
      groups.set(key, [...(groups.get(key) ?? []), s]);
    }
    return [...groups];
  }, [samples]);
  return (
    <SelectField
      {...field}
      hint={
        hint ??
        (samples.length === 0
          ? 'No samples yet: add a coating, a batch and a sample first.'
          : undefined)
      }
    >
      {byCoating.map(([group, choices]) => (
        <optgroup key={group} label={group}>
          {choices.map((s) => (
            <option key={s.id} value={s.id}>
              {s.lotCode} / {s.label}
            </option>
          ))}
        </optgroup>
      ))}
    </SelectField>
  );
}

/** A probe-liquid picker, by name. */
export function LiquidSelect({
  liquids,
  ...field
}: { liquids: readonly Pick<LiquidChoice, 'id' | 'name'>[] } & Omit<
  ComponentProps<typeof SelectField>,
  'options'
>) {
  return <SelectField {...field} options={liquids.map((l) => ({ value: l.id, label: l.name }))} />;
}

/** "B-0412 / P1" for a sample id, or a dash. */
export const sampleName = (samples: SampleChoice[], id: string) => {
  const s = samples.find((c) => c.id === id);
  return s ? `${s.lotCode} / ${s.label}` : '—';
};

export const liquidName = (liquids: LiquidChoice[], id: string) =>
  liquids.find((l) => l.id === id)?.name ?? '—';
