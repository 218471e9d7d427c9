import {
  archiveOrDeleteProbeLiquid,
  getProbeLiquid,
  updateProbeLiquid,
} from '@/db/queries/probe-liquids';
import { recordRoutes } from '@/lib/api/record-routes';
import { probeLiquidUpdateSchema } from '@/lib/validation/records';

/**
 * GET → { probeLiquid }; PATCH with { version, …fields } → { probeLiquid } (409 with the current record when
 * stale); DELETE archives the record when results depend on it (or with ?mode=archive), else
 * deletes it → { outcome, probeLiquid }.
 */
export const { GET, PATCH, DELETE } = recordRoutes({
  key: 'probeLiquid',
  plural: 'probe liquids',
  writeAction: 'catalog:manage',
  updateSchema: probeLiquidUpdateSchema,
  get: getProbeLiquid,
  update: updateProbeLiquid,
  archiveOrDelete: archiveOrDeleteProbeLiquid,
});
