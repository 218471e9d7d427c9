import { recordItemRoutes } from '@/server/http/record-routes';
import { batchRecords } from '@/server/records/kinds';

/** One batch: GET, PATCH with its version, DELETE (archives when results depend on it). */
export const { GET, PATCH, DELETE } = recordItemRoutes(batchRecords);
