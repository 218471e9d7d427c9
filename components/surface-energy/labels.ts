import { SURFACE_ENERGY_METHOD_NAMES } from '@/lib/surface-energy/compute';

/** What the surface-energy page calls each method: its published name. */
export const METHOD_LABELS = SURFACE_ENERGY_METHOD_NAMES;

/** Readable names of the result components, mN/m. */
export const COMPONENT_LABELS: Record<string, string> = {
  gammaTotal: 'Total',
  gammaDispersive: 'Dispersive',
  gammaPolar: 'Polar',
  criticalSurfaceTension: 'Critical surface tension γc',
  gammaSolid: 'Solid surface tension γS',
  gammaLW: 'Lifshitz–van der Waals',
  gammaPlus: 'Acid γ+',
  gammaMinus: 'Base γ−',
  gammaAB: 'Acid–base',
};
