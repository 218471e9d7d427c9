import { recordItemRoutes } from '@/server/http/record-routes';
import { measurementSessionRecords } from '@/server/records/kinds';

/** One measurement session: GET, PATCH with its version, DELETE (archives when results depend on it). */
export const { GET, PATCH, DELETE } = recordItemRoutes(measurementSessionRecords);
