import { recordExportRoute } from '@/server/http/record-routes';
import { probeLiquidRecords } from '@/server/records/kinds';

/** Every probe liquid matching the list's filters and sort, as UTF-8 CSV. */
export const GET = recordExportRoute(probeLiquidRecords);
