import {
  archiveOrDeleteMeasurementSession,
  getMeasurementSession,
  updateMeasurementSession,
} from '@/db/queries/measurement-sessions';
import { recordRoutes } from '@/lib/api/record-routes';
import { measurementSessionUpdateSchema } from '@/lib/validation/records';

/**
 * GET → { measurementSession }; PATCH with { version, …fields } → { measurementSession } (409 with the current record when
 * stale); DELETE archives the record when results depend on it (or with ?mode=archive), else
 * deletes it → { outcome, measurementSession }.
 */
export const { GET, PATCH, DELETE } = recordRoutes({
  key: 'measurementSession',
  plural: 'measurement sessions',
  writeAction: 'records:write',
  updateSchema: measurementSessionUpdateSchema,
  get: getMeasurementSession,
  update: updateMeasurementSession,
  archiveOrDelete: archiveOrDeleteMeasurementSession,
});
