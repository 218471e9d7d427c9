import { saveDynamicSchema } from '@/lib/contracts/dynamic';
import { saveDynamicMeasurement } from '@/server/dynamic/save';
import { json, route } from '@/server/http/route';

/**
 * Saves a series of frames of one drop to a sample: the server decodes and analyses the stored
 * source (video or frame photos) in a worker thread → 201 { measurementId, analysisId, revision,
 * result }. With `measurementId` the save is a new revision of that measurement.
 */
export const POST = route(
  {
    access: 'records:write',
    what: 'save measurements',
    body: saveDynamicSchema,
    maxBodyBytes: 256 * 1024,
  },
  async ({ actor, body }) => json(await saveDynamicMeasurement(actor, body), 201),
);
