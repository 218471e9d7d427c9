import { findComparisonCoating, loadComparison } from '@/db/queries/comparison';
import { HttpError } from '@/lib/api/errors';
import { route } from '@/lib/auth/guard';
import { can } from '@/lib/auth/permissions';
import { dropsCsv } from '@/lib/compare/csv';
import { parseCompareQuery } from '@/lib/compare/query';

/**
 * The comparison's raw drops as CSV (UTF-8, header row with units), with the same filters as
 * the compare page: ?coating=<id or code>&batches=<ids or lot codes, comma-separated>.
 */
export const GET = route(
  'results:export',
  async (request, ctx) => {
    const query = parseCompareQuery(new URL(request.url).searchParams);
    if (!query.coating) {
      throw new HttpError(400, 'invalid_input', 'Say which coating to export: add ?coating=<code>.', {
        coating: 'Choose a coating.',
      });
    }
    const coating = await findComparisonCoating(ctx.organization.id, query.coating);
    if (!coating) {
      throw new HttpError(404, 'not_found', `There is no coating "${query.coating}" in this organization.`, {
        coating: 'Choose a coating of this organization.',
      });
    }
    const data = await loadComparison(ctx.organization.id, coating.id, {
      batches: query.batches,
      approvedOnly: !can(ctx.organization.role, 'results:read-all'),
    });
    const names = new Map(data.liquids.map((l) => [l.id, l.name]));
    const csv = dropsCsv(
      data.drops.map((d) => ({
        coatingCode: coating.code,
        lotCode: d.lotCode,
        producedOn: d.producedOn,
        sampleLabel: d.sampleLabel,
        liquidName: names.get(d.probeLiquidId) ?? d.probeLiquidId,
        dropId: d.dropId,
        revision: d.revision,
        reviewStatus: d.reviewStatus,
        measuredAt: d.measuredAt,
        treatedAt: d.treatedAt,
        leftDeg: d.leftDeg,
        rightDeg: d.rightDeg,
        meanDeg: d.meanDeg,
      })),
    );
    const file = `beadline-${coating.code.replace(/[^A-Za-z0-9._-]+/g, '_')}-drops.csv`;
    return new Response(csv, {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="${file}"`,
        'cache-control': 'private, no-store',
      },
    });
  },
  { what: 'export results' },
);
