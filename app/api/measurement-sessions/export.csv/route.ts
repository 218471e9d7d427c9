import { recordExportRoute } from '@/server/http/record-routes';
import { measurementSessionRecords } from '@/server/records/kinds';

/** Every measurement session matching the list's filters and sort, as UTF-8 CSV. */
export const GET = recordExportRoute(measurementSessionRecords);
