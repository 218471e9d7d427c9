import { archiveOrDeleteBatch, getBatch, updateBatch } from '@/db/queries/batches';
import { recordRoutes } from '@/lib/api/record-routes';
import { batchUpdateSchema } from '@/lib/validation/records';

/**
 * GET → { batch }; PATCH with { version, …fields } → { batch } (409 with the current record when
 * stale); DELETE archives the record when results depend on it (or with ?mode=archive), else
 * deletes it → { outcome, batch }.
 */
export const { GET, PATCH, DELETE } = recordRoutes({
  key: 'batch',
  plural: 'batches',
  writeAction: 'records:write',
  updateSchema: batchUpdateSchema,
  get: getBatch,
  update: updateBatch,
  archiveOrDelete: archiveOrDeleteBatch,
});
