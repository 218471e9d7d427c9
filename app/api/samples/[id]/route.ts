import { archiveOrDeleteSample, getSample, updateSample } from '@/db/queries/samples';
import { recordRoutes } from '@/lib/api/record-routes';
import { sampleUpdateSchema } from '@/lib/validation/records';

/**
 * GET → { sample }; PATCH with { version, …fields } → { sample } (409 with the current record when
 * stale); DELETE archives the record when results depend on it (or with ?mode=archive), else
 * deletes it → { outcome, sample }.
 */
export const { GET, PATCH, DELETE } = recordRoutes({
  key: 'sample',
  plural: 'samples',
  writeAction: 'records:write',
  updateSchema: sampleUpdateSchema,
  get: getSample,
  update: updateSample,
  archiveOrDelete: archiveOrDeleteSample,
});
