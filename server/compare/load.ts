import 'server-only';
import {
  DEFAULT_BATCH_COUNT,
  findComparisonCoating,
  listComparisonCoatings,
  loadComparison,
} from '@/db/queries/comparison';
import type { OrgContext } from '@/lib/auth/context';
import { resultVisibility } from '../visibility';
import { can } from '@/lib/auth/permissions';
import { buildComparison, compareSearch, dropsCsv, type CompareQuery } from '@/lib/compare';
import { AppError } from '@/lib/app-error';

export { DEFAULT_BATCH_COUNT };

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
  const coatings = await listComparisonCoatings(organizationId);
  // The chosen coating is one of the live coatings just listed: no second round trip.
  const coating = query.coating
    ? (coatings.find((c) => c.id === query.coating || c.code === query.coating) ?? null)
    : null;
  const data = coating
    ? await loadComparison(organizationId, coating.id, { batches: query.batches, visibility })
    : null;
  const known = new Set(data?.allBatches.flatMap((b) => [b.id, b.lotCode]) ?? []);
  const reference =
    data?.batches.find((b) => b.id === query.ref || b.lotCode === query.ref) ?? null;
  const comparison =
    data && coating
      ? buildComparison({
          batches: data.batches,
          liquids: data.liquids,
          specs: data.specs,
          drops: data.drops,
          dynamic: data.dynamic,
          referenceBatchId: reference?.id ?? null,
        })
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
  const coating = await findComparisonCoating(ctx.organization.id, query.coating);
  if (!coating) {
    throw new AppError(
      'not_found',
      `There is no coating "${query.coating}" in this organization.`,
      {
        fields: { coating: 'Choose a coating of this organization.' },
      },
    );
  }
  const data = await loadComparison(ctx.organization.id, coating.id, {
    batches: query.batches,
    visibility: resultVisibility(ctx.organization.role),
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
  const fileName = `beadline-${coating.code.replace(/[^A-Za-z0-9._-]+/g, '_')}-drops.csv`;
  return { csv, fileName };
}
