import { recordExportRoute } from '@/server/http/record-routes';
import { batchRecords } from '@/server/records/kinds';

/** Every batch matching the list's filters and sort, as UTF-8 CSV. */
export const GET = recordExportRoute(batchRecords);
