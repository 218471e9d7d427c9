import { recordExportRoute } from '@/server/http/record-routes';
import { specRecords } from '@/server/records/kinds';

/** Every spec matching the list's filters and sort, as UTF-8 CSV. */
export const GET = recordExportRoute(specRecords);
