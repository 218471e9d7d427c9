import { recordExportRoute } from '@/server/http/record-routes';
import { sampleRecords } from '@/server/records/kinds';

/** Every sample matching the list's filters and sort, as UTF-8 CSV. */
export const GET = recordExportRoute(sampleRecords);
