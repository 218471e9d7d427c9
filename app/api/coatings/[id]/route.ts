import { recordItemRoutes } from '@/server/http/record-routes';
import { coatingRecords } from '@/server/records/kinds';

/** One coating: GET, PATCH with its version, DELETE (archives when results depend on it). */
export const { GET, PATCH, DELETE } = recordItemRoutes(coatingRecords);
