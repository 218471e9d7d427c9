import { recordItemRoutes } from '@/server/http/record-routes';
import { sampleRecords } from '@/server/records/kinds';

/** One sample: GET, PATCH with its version, DELETE (archives when results depend on it). */
export const { GET, PATCH, DELETE } = recordItemRoutes(sampleRecords);
