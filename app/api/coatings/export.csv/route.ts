import { recordExportRoute } from '@/server/http/record-routes';
import { coatingRecords } from '@/server/records/kinds';

/** Every coating matching the list's filters and sort, as UTF-8 CSV. */
export const GET = recordExportRoute(coatingRecords);
