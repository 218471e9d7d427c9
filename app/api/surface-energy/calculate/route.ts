import { route } from '@/lib/auth/guard';
import { parseJsonBody } from '@/lib/validation/records';
import {
  computeSurfaceEnergy,
  methodAvailability,
  surfaceEnergyCalculateSchema,
} from '@/lib/validation/surface-energy';

/**
 * Surface free energy from liquids and their mean angles; a pure calculation, nothing stored.
 * Body: { liquids: [{ name, gammaTotal, gammaDispersive, gammaPolar, gammaLW?, gammaPlus?,
 * gammaMinus?, angleDeg, angleSdDeg?, n? }], methods?: ['owrk', …], uncertaintyBasis?: 'mean' |
 * 'single', envelopeAngleDeg? } → { availability, outputs }.
 */
export const POST = route('organization:read', async (request) => {
  const input = await parseJsonBody(request, surfaceEnergyCalculateSchema);
  return Response.json({
    availability: methodAvailability(input.liquids),
    outputs: computeSurfaceEnergy(input.liquids, input),
  });
});
