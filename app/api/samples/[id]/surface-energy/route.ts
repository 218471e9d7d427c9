import { surfaceEnergyRoutes } from '@/server/http/surface-energy-routes';

/**
 * The sample's angle table, computed and saved surface energy (see surfaceEnergyRoutes).
 * GET ?methods=owrk,wu&uncertaintyBasis=mean|single&envelopeAngleDeg=0; POST saves → 201.
 */
export const { GET, POST } = surfaceEnergyRoutes('sample');
