import { listSpecs } from '@/db/queries/specs';
import { route } from '@/lib/auth/guard';
import { csvFileName, csvResponse, pagedRows } from '@/lib/csv';
import { specColumns } from '@/lib/csv/columns';
import { MAX_PAGE_SIZE, specListQuerySchema, parseSearchParams } from '@/lib/validation/records';

/** Every spec matching the list's filters and sort (all pages) as UTF-8 CSV; same query as GET /api/specs. */
export const GET = route(
  'results:export',
  async (request, ctx) => {
    const query = parseSearchParams(specListQuerySchema, new URL(request.url).searchParams);
    return csvResponse({
      fileName: csvFileName('specs'),
      columns: specColumns,
      fetchPage: pagedRows(
        (page, pageSize) => listSpecs(ctx.organization.id, { ...query, page, pageSize }),
        MAX_PAGE_SIZE,
      ),
    });
  },
  { what: 'export tables' },
);
