import { listMeasurementSessions } from '@/db/queries/measurement-sessions';
import { route } from '@/lib/auth/guard';
import { csvFileName, csvResponse, pagedRows } from '@/lib/csv';
import { measurementSessionColumns } from '@/lib/csv/columns';
import {
  MAX_PAGE_SIZE,
  measurementSessionListQuerySchema,
  parseSearchParams,
} from '@/lib/validation/records';

/** Every measurement session matching the list's filters and sort (all pages) as UTF-8 CSV; same query as GET /api/measurement-sessions. */
export const GET = route(
  'results:export',
  async (request, ctx) => {
    const query = parseSearchParams(
      measurementSessionListQuerySchema,
      new URL(request.url).searchParams,
    );
    return csvResponse({
      fileName: csvFileName('measurement-sessions'),
      columns: measurementSessionColumns,
      fetchPage: pagedRows(
        (page, pageSize) =>
          listMeasurementSessions(ctx.organization.id, { ...query, page, pageSize }),
        MAX_PAGE_SIZE,
      ),
    });
  },
  { what: 'export tables' },
);
