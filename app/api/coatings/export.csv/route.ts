import { listCoatings } from '@/db/queries/coatings';
import { route } from '@/lib/auth/guard';
import { csvFileName, csvResponse, pagedRows } from '@/lib/csv';
import { coatingColumns } from '@/lib/csv/columns';
import { MAX_PAGE_SIZE, coatingListQuerySchema, parseSearchParams } from '@/lib/validation/records';

/** Every coating matching the list's filters and sort (all pages) as UTF-8 CSV; same query as GET /api/coatings. */
export const GET = route(
  'results:export',
  async (request, ctx) => {
    const query = parseSearchParams(coatingListQuerySchema, new URL(request.url).searchParams);
    return csvResponse({
      fileName: csvFileName('coatings'),
      columns: coatingColumns,
      fetchPage: pagedRows(
        (page, pageSize) => listCoatings(ctx.organization.id, { ...query, page, pageSize }),
        MAX_PAGE_SIZE,
      ),
    });
  },
  { what: 'export tables' },
);
