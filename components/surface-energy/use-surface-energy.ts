'use client';

import { useState } from 'react';
import {
  surfaceEnergyUrl,
  useSavedSurfaceEnergy,
  useSurfaceEnergyCalculation,
  type SavedSurfaceEnergy,
  type SurfaceEnergySubjectRef,
} from '@/components/data/resources';
import { useMutation } from '@/components/data/use-mutation';
import { surfaceEnergySavedResponseSchema } from '@/lib/contracts/surface-energy';
import type { SurfaceEnergyMethod } from '@/lib/surface-energy';
import type {
  LiquidAngle,
  SurfaceEnergyOutputs,
  UncertaintyBasis,
} from '@/lib/surface-energy/compute';

export type MethodChoice = { methods: SurfaceEnergyMethod[]; basis: UncertaintyBasis };

/** The page's first choice, the one the server rendered. */
export const FIRST_CHOICE: MethodChoice = { methods: ['owrk'], basis: 'mean' };

/**
 * The surface-energy page's data: the methods and uncertainty basis chosen, the results
 * computed for them (recomputed on every change), and saving them with the sample or batch.
 */
export function useSurfaceEnergy({
  subject,
  liquids,
  initialOutputs,
  initialSaved,
}: {
  subject: SurfaceEnergySubjectRef;
  liquids: LiquidAngle[];
  initialOutputs: SurfaceEnergyOutputs | null;
  initialSaved: SavedSurfaceEnergy[];
}) {
  const [choice, setChoice] = useState<MethodChoice>(FIRST_CHOICE);
  const calculation = useSurfaceEnergyCalculation(
    // Nothing to send without a method, or without liquids (the page then says so).
    choice.methods.length > 0 && liquids.length > 0
      ? { liquids, methods: choice.methods, uncertaintyBasis: choice.basis }
      : null,
    initialOutputs,
  );
  const saved = useSavedSurfaceEnergy(subject, initialSaved);
  const saving = useMutation<{ result: SavedSurfaceEnergy }>();
  const [savedNow, setSavedNow] = useState(false);

  function choose(next: MethodChoice) {
    setChoice(next);
    setSavedNow(false);
    saving.reset();
  }

  async function save() {
    setSavedNow(false);
    const result = await saving.run(surfaceEnergyUrl(subject), {
      method: 'POST',
      json: { methods: choice.methods, uncertaintyBasis: choice.basis },
      schema: surfaceEnergySavedResponseSchema,
    });
    if (!result.ok) return;
    saved.add(result.data.result);
    setSavedNow(true);
  }

  return {
    choice,
    choose,
    outputs: calculation.outputs,
    computing: calculation.computing,
    error:
      choice.methods.length === 0
        ? 'Choose at least one method.'
        : (calculation.error?.message ?? null),
    saved: saved.saved,
    save,
    saving: saving.pending,
    saveMessage: saving.message
      ? { ok: false, text: saving.message }
      : savedNow
        ? { ok: true, text: `Saved with the ${subject.kind}.` }
        : null,
  };
}
