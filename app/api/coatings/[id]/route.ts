import { archiveOrDeleteCoating, getCoating, updateCoating } from '@/db/queries/coatings';
import { recordRoutes } from '@/lib/api/record-routes';
import { coatingUpdateSchema } from '@/lib/validation/records';

/**
 * GET → { coating }; PATCH with { version, …fields } → { coating } (409 with the current record when
 * stale); DELETE archives the record when results depend on it (or with ?mode=archive), else
 * deletes it → { outcome, coating }.
 */
export const { GET, PATCH, DELETE } = recordRoutes({
  key: 'coating',
  plural: 'coatings',
  writeAction: 'catalog:manage',
  updateSchema: coatingUpdateSchema,
  get: getCoating,
  update: updateCoating,
  archiveOrDelete: archiveOrDeleteCoating,
});
