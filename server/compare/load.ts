import 'server-only';
import {
  DEFAULT_BATCH_COUNT,
  listComparisonCoatings,
  loadComparison,
  type ComparisonCoating,
} from '@/db/queries/comparison';
import type { OrgContext } from '@/lib/auth/context';
import { resultVisibility } from '../visibility';
import { can } from '@/lib/auth/permissions';
import { buildComparison, compareSearch, dropsCsv, type CompareQuery } from '@/lib/compare';
import { AppError } from '@/lib/app-error';
import { resultCache, type ResultCache } from '../cache/results';

export { DEFAULT_BATCH_COUNT };

/** The live coatings (cached with the organization's data). */
const liveCoatings = (cache: ResultCache, organizationId: string) =>
  cache.get('coatings', () => listComparisonCoatings(organizationId));

/** The coating of the query among the live ones, by id or code. */
const coatingOf = (coatings: ComparisonCoating[], idOrCode: string) =>
  coatings.find((c) => c.id === idOrCode || c.code === idOrCode) ?? null;

/** What a comparison of `coatingId` over the chosen batches reads (cached with the data). */
function comparisonData(
  cache: ResultCache,
  organizationId: string,
  coatingId: string,
  batches: readonly string[],
) {
  return cache.get(`comparison-data\u0000${coatingId}\u0000${batches.join('\u0001')}`, () =>
    loadComparison(organizationId, coatingId, { batches, visibility: cache.visibility }),
  );
}

/**
 * The compare page: the coatings to choose from and, for the chosen coating, its batches, the
 * comparison (statistics, verdicts, tests) and what in the URL did not match. Viewers see
 * approved results only.
 */
export async function loadComparePage(ctx: OrgContext, query: CompareQuery) {
  const organizationId = ctx.organization.id;
  const role = ctx.organization.role;
  const visibility = resultVisibility(role);
  const approvedOnly = visibility === 'approved';
  const cache = await resultCache(organizationId, visibility);
  const coatings = await liveCoatings(cache, organizationId);
  // The chosen coating is one of the live coatings just listed: no second round trip.
  const coating = query.coating ? coatingOf(coatings, query.coating) : null;
  const data = coating
    ? await comparisonData(cache, organizationId, coating.id, query.batches)
    : null;
  const known = new Set(data?.allBatches.flatMap((b) => [b.id, b.lotCode]) ?? []);
  const reference =
    data?.batches.find((b) => b.id === query.ref || b.lotCode === query.ref) ?? null;
  const comparison =
    data && coating
      ? await cache.get(
          `comparison\u0000${coating.id}\u0000${query.batches.join('\u0001')}\u0000${reference?.id ?? ''}`,
          async () =>
            buildComparison({
              batches: data.batches,
              liquids: data.liquids,
              specs: data.specs,
              drops: data.drops,
              dynamic: data.dynamic,
              referenceBatchId: reference?.id ?? null,
            }),
        )
      : null;
  const chosenLots = data?.batches.map((b) => b.lotCode) ?? [];
  const exportHref =
    coating && data && data.drops.length > 0 && can(role, 'results:export')
      ? `/api/compare/drops.csv${compareSearch({ coating: coating.code, batches: chosenLots, ref: null })}`
      : null;
  return {
    approvedOnly,
    coatings,
    coating,
    data,
    comparison,
    reference,
    chosenLots,
    unknownBatches: query.batches.filter((b) => !known.has(b)),
    exportHref,
  };
}

/**
 * The comparison's raw drops as CSV (UTF-8, header row with units), with the same filters as the
 * compare page.
 */
export async function exportComparisonDrops(
  ctx: OrgContext,
  query: CompareQuery,
): Promise<{ csv: string; fileName: string }> {
  if (!query.coating) {
    throw new AppError('invalid_input', 'Say which coating to export: add ?coating=<code>.', {
      fields: { coating: 'Choose a coating.' },
    });
  }
  const organizationId = ctx.organization.id;
  const cache = await resultCache(organizationId, resultVisibility(ctx.organization.role));
  const coating = coatingOf(await liveCoatings(cache, organizationId), query.coating);
  if (!coating) {
    throw new AppError(
      'not_found',
      `There is no coating "${query.coating}" in this organization.`,
      {
        fields: { coating: 'Choose a coating of this organization.' },
      },
    );
  }
  const batches = query.batches;
  const csv = await cache.get(
    `drops-csv\u0000${coating.id}\u0000${batches.join('\u0001')}`,
    async () => {
      const data = await comparisonData(cache, organizationId, coating.id, batches);
      const names = new Map(data.liquids.map((l) => [l.id, l.name]));
      return dropsCsv(
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
    },
  );
  const fileName = `beadline-${coating.code.replace(/[^A-Za-z0-9._-]+/g, '_')}-drops.csv`;
  return { csv, fileName };
}
