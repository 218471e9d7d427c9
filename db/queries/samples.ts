import 'server-only';
import { eq, getTableColumns, isNull } from 'drizzle-orm';
import type { Page } from '@/lib/contracts/common';
import type { SampleListItem, SampleListQuery } from '@/lib/contracts/samples';
import { batches, samples } from '../schema';
import { listPage, ownedBy, textSearch } from './records';

const SORT_COLUMNS = {
  label: samples.label,
  treatedAt: samples.treatedAt,
  createdAt: samples.createdAt,
  updatedAt: samples.updatedAt,
} as const;

/** Samples with their batch's lot code and coating. */
export async function listSamples(
  organizationId: string,
  query: SampleListQuery,
): Promise<Page<SampleListItem>> {
  return listPage({
    from: samples,
    columns: {
      ...getTableColumns(samples),
      batchLotCode: batches.lotCode,
      coatingId: batches.coatingId,
    },
    joins: [{ kind: 'inner', table: batches, on: eq(batches.id, samples.batchId) }],
    where: [
      ownedBy(samples, organizationId),
      query.includeArchived ? undefined : isNull(samples.archivedAt),
      query.batchId ? eq(samples.batchId, query.batchId) : undefined,
      query.coatingId ? eq(batches.coatingId, query.coatingId) : undefined,
      textSearch(query.q, [samples.label, samples.substrate, samples.position, samples.notes]),
    ],
    sort: SORT_COLUMNS[query.sort],
    query,
  });
}
