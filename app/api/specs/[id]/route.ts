import { recordItemRoutes } from '@/server/http/record-routes';
import { specRecords } from '@/server/records/kinds';

/** One spec: GET, PATCH with its version, DELETE (archives when results depend on it). */
export const { GET, PATCH, DELETE } = recordItemRoutes(specRecords);
