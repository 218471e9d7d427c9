import 'server-only';
import type {
  SurfaceEnergyCalculate,
  SurfaceEnergyCalculation,
} from '@/lib/contracts/surface-energy';
import { computeSurfaceEnergy, methodAvailability } from '@/lib/surface-energy/compute';

/** Surface free energy from liquids and their mean angles alone; nothing is read or stored. */
export function calculateSurfaceEnergy(input: SurfaceEnergyCalculate): SurfaceEnergyCalculation {
  return {
    availability: methodAvailability(input.liquids),
    outputs: computeSurfaceEnergy(input.liquids, input),
  };
}
