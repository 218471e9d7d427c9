import { listBatches } from '@/db/queries/batches';
import { route } from '@/lib/auth/guard';
import { csvFileName, csvResponse, pagedRows } from '@/lib/csv';
import { batchColumns } from '@/lib/csv/columns';
import { MAX_PAGE_SIZE, batchListQuerySchema, parseSearchParams } from '@/lib/validation/records';

/** Every batch matching the list's filters and sort (all pages) as UTF-8 CSV; same query as GET /api/batches. */
export const GET = route(
  'results:export',
  async (request, ctx) => {
    const query = parseSearchParams(batchListQuerySchema, new URL(request.url).searchParams);
    return csvResponse({
      fileName: csvFileName('batches'),
      columns: batchColumns,
      fetchPage: pagedRows(
        (page, pageSize) => listBatches(ctx.organization.id, { ...query, page, pageSize }),
        MAX_PAGE_SIZE,
      ),
    });
  },
  { what: 'export tables' },
);
