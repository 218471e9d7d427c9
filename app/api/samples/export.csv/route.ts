import { listSamplesWithResults } from '@/db/queries/exports';
import { route } from '@/lib/auth/guard';
import { csvFileName, csvResponse, pagedRows } from '@/lib/csv';
import { sampleColumns } from '@/lib/csv/columns';
import { MAX_PAGE_SIZE, sampleListQuerySchema, parseSearchParams } from '@/lib/validation/records';

/** Every sample matching the list's filters and sort (all pages) as UTF-8 CSV; same query as GET /api/samples. */
export const GET = route(
  'results:export',
  async (request, ctx) => {
    const query = parseSearchParams(sampleListQuerySchema, new URL(request.url).searchParams);
    return csvResponse({
      fileName: csvFileName('samples'),
      columns: sampleColumns(),
      fetchPage: pagedRows(
        (page, pageSize) =>
          listSamplesWithResults(ctx.organization.id, { ...query, page, pageSize }),
        MAX_PAGE_SIZE,
      ),
    });
  },
  { what: 'export tables' },
);
