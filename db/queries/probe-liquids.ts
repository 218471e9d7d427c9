import 'server-only';
import { eq, isNull } from 'drizzle-orm';
import type { Page } from '@/lib/contracts/common';
import type { ProbeLiquidListQuery } from '@/lib/contracts/probe-liquids';
import { probeLiquids } from '../schema';
import { listPage, probeLiquidVisibleTo, textSearch } from './records';

export type ProbeLiquidRow = typeof probeLiquids.$inferSelect;

const SORT_COLUMNS = {
  name: probeLiquids.name,
  totalMnM: probeLiquids.totalMnM,
  createdAt: probeLiquids.createdAt,
} as const;

/** The built-in library and the organization's own liquids. Query `origin`: all, built-in, own. */
export async function listProbeLiquidRows(
  organizationId: string,
  query: ProbeLiquidListQuery,
): Promise<Page<ProbeLiquidRow>> {
  const origin =
    query.origin === 'built-in'
      ? isNull(probeLiquids.organizationId)
      : query.origin === 'own'
        ? eq(probeLiquids.organizationId, organizationId)
        : probeLiquidVisibleTo(organizationId);
  return listPage({
    from: probeLiquids,
    where: [
      origin,
      query.includeArchived ? undefined : isNull(probeLiquids.archivedAt),
      textSearch(query.q, [probeLiquids.name]),
    ],
    sort: SORT_COLUMNS[query.sort],
    query,
  });
}
