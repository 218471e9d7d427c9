import { surfaceEnergyRoutes } from '@/server/http/surface-energy-routes';

/**
 * Surface energy of a whole batch: the drops of all its live samples pooled per probe liquid
 * (see surfaceEnergyRoutes). GET ?methods=…; POST saves with the batch → 201.
 */
export const { GET, POST } = surfaceEnergyRoutes('batch');
