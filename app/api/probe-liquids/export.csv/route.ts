import { listProbeLiquids } from '@/db/queries/probe-liquids';
import { route } from '@/lib/auth/guard';
import { csvFileName, csvResponse, pagedRows } from '@/lib/csv';
import { probeLiquidColumns } from '@/lib/csv/columns';
import {
  MAX_PAGE_SIZE,
  probeLiquidListQuerySchema,
  parseSearchParams,
} from '@/lib/validation/records';

/** Every probe liquid matching the list's filters and sort (all pages) as UTF-8 CSV; same query as GET /api/probe-liquids. */
export const GET = route(
  'results:export',
  async (request, ctx) => {
    const query = parseSearchParams(probeLiquidListQuerySchema, new URL(request.url).searchParams);
    return csvResponse({
      fileName: csvFileName('probe-liquids'),
      columns: probeLiquidColumns,
      fetchPage: pagedRows(
        (page, pageSize) => listProbeLiquids(ctx.organization.id, { ...query, page, pageSize }),
        MAX_PAGE_SIZE,
      ),
    });
  },
  { what: 'export tables' },
);
