import { parseCompareQuery } from '@/lib/compare/query';
import { exportComparisonDrops } from '@/server/compare/load';
import { route } from '@/server/http/route';

/**
 * The comparison's raw drops as CSV (UTF-8, header row with units), with the same filters as
 * the compare page: ?coating=<id or code>&batches=<ids or lot codes, comma-separated>.
 */
export const GET = route(
  { access: 'results:export', what: 'export results' },
  async ({ ctx, request }) => {
    const query = parseCompareQuery(new URL(request.url).searchParams);
    const { csv, fileName } = await exportComparisonDrops(ctx, query);
    return new Response(csv, {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="${fileName}"`,
        'cache-control': 'private, no-store',
      },
    });
  },
);
