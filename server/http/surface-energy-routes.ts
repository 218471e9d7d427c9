import 'server-only';
import { idParamsSchema } from '@/lib/contracts/common';
import {
  sampleSurfaceEnergyQuerySchema,
  sampleSurfaceEnergySchema,
} from '@/lib/contracts/surface-energy';
import type { SubjectKind } from '../surface-energy/evaluate';
import { surfaceEnergyOf } from '../surface-energy/read';
import { saveSurfaceEnergy } from '../surface-energy/save';
import { json, route } from './route';

/**
 * GET and POST of /api/samples/[id]/surface-energy and /api/batches/[id]/surface-energy. A batch
 * pools the drops of all its live samples: per probe liquid, the mean ± SD over every drop.
 *
 * GET: the angle table (latest analysis of each drop; approved results only for viewers), the
 * computed surface energy and the saved results. Query: methods=owrk,wu,
 * uncertaintyBasis=mean|single, envelopeAngleDeg.
 * POST: computes and saves with its inputs. Body: { methods?, uncertaintyBasis?,
 * envelopeAngleDeg? } → 201 { result }.
 */
export function surfaceEnergyRoutes(kind: SubjectKind) {
  return {
    GET: route(
      {
        access: 'organization:read',
        params: idParamsSchema,
        query: sampleSurfaceEnergyQuerySchema,
      },
      async ({ ctx, params, query }) => json(await surfaceEnergyOf(ctx, kind, params.id, query)),
    ),
    POST: route(
      {
        access: 'records:write',
        what: 'save surface energy results',
        params: idParamsSchema,
        body: sampleSurfaceEnergySchema,
      },
      async ({ ctx, params, body }) =>
        json({ result: await saveSurfaceEnergy(ctx, kind, params.id, body) }, 201),
    ),
  };
}
