import 'server-only';
import { eq, getTableColumns, isNull } from 'drizzle-orm';
import type { Page } from '@/lib/contracts/common';
import type { SpecListItem, SpecListQuery } from '@/lib/contracts/specs';
import { coatings, probeLiquids, specs } from '../schema';
import { listPage, ownedBy, textSearch } from './records';

const SORT_COLUMNS = {
  createdAt: specs.createdAt,
  updatedAt: specs.updatedAt,
  minDeg: specs.minDeg,
  maxDeg: specs.maxDeg,
  scope: specs.scope,
} as const;

/** Specs with their coating's code and their probe liquid's name. */
export async function listSpecs(
  organizationId: string,
  query: SpecListQuery,
): Promise<Page<SpecListItem>> {
  return listPage({
    from: specs,
    columns: {
      ...getTableColumns(specs),
      coatingCode: coatings.code,
      probeLiquidName: probeLiquids.name,
    },
    joins: [
      { kind: 'inner', table: coatings, on: eq(coatings.id, specs.coatingId) },
      { kind: 'inner', table: probeLiquids, on: eq(probeLiquids.id, specs.probeLiquidId) },
    ],
    where: [
      ownedBy(specs, organizationId),
      query.includeArchived ? undefined : isNull(specs.archivedAt),
      query.coatingId ? eq(specs.coatingId, query.coatingId) : undefined,
      query.probeLiquidId ? eq(specs.probeLiquidId, query.probeLiquidId) : undefined,
      textSearch(query.q, [specs.note, coatings.code, probeLiquids.name]),
    ],
    sort: SORT_COLUMNS[query.sort],
    query,
  });
}
