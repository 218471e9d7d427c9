import { archiveOrDeleteSpec, getSpec, updateSpec } from '@/db/queries/specs';
import { recordRoutes } from '@/lib/api/record-routes';
import { specUpdateSchema } from '@/lib/validation/records';

/**
 * GET → { spec }; PATCH with { version, …fields } → { spec } (409 with the current record when
 * stale); DELETE archives the record when results depend on it (or with ?mode=archive), else
 * deletes it → { outcome, spec }.
 */
export const { GET, PATCH, DELETE } = recordRoutes({
  key: 'spec',
  plural: 'specs',
  writeAction: 'catalog:manage',
  updateSchema: specUpdateSchema,
  get: getSpec,
  update: updateSpec,
  archiveOrDelete: archiveOrDeleteSpec,
});
