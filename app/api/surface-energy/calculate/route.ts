import { surfaceEnergyCalculateSchema } from '@/lib/contracts/surface-energy';
import { json, route } from '@/server/http/route';
import { calculateSurfaceEnergy } from '@/server/surface-energy/calculate';

/**
 * Surface free energy from liquids and their mean angles; a pure calculation, nothing stored.
 * Body: { liquids: [{ name, gammaTotal, gammaDispersive, gammaPolar, gammaLW?, gammaPlus?,
 * gammaMinus?, angleDeg, angleSdDeg?, n? }], methods?: ['owrk', …], uncertaintyBasis?: 'mean' |
 * 'single', envelopeAngleDeg? } → { availability, outputs }.
 */
export const POST = route(
  { access: 'organization:read', body: surfaceEnergyCalculateSchema },
  async ({ body }) => json(calculateSurfaceEnergy(body)),
);
