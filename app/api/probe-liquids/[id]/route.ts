import { recordItemRoutes } from '@/server/http/record-routes';
import { probeLiquidRecords } from '@/server/records/kinds';

/** One probe liquid: GET, PATCH with its version, DELETE (archives when results depend on it). */
export const { GET, PATCH, DELETE } = recordItemRoutes(probeLiquidRecords);
