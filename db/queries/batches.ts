import 'server-only';
import { and, eq, getTableColumns, gte, isNull, lte } from 'drizzle-orm';
import type { BatchListItem, BatchListQuery } from '@/lib/contracts/batches';
import type { Page } from '@/lib/contracts/common';
import { batches, coatings } from '../schema';
import { listPage, ownedBy, textSearch } from './records';
import { database } from './transaction';

const SORT_COLUMNS = {
  producedOn: batches.producedOn,
  lotCode: batches.lotCode,
  createdAt: batches.createdAt,
  updatedAt: batches.updatedAt,
} as const;

/** Batches with their coating's code and name. */
export async function listBatches(
  organizationId: string,
  query: BatchListQuery,
): Promise<Page<BatchListItem>> {
  return listPage({
    from: batches,
    columns: {
      ...getTableColumns(batches),
      coatingCode: coatings.code,
      coatingName: coatings.name,
    },
    joins: [{ kind: 'inner', table: coatings, on: eq(coatings.id, batches.coatingId) }],
    where: [
      ownedBy(batches, organizationId),
      query.includeArchived ? undefined : isNull(batches.archivedAt),
      query.coatingId ? eq(batches.coatingId, query.coatingId) : undefined,
      query.producedFrom ? gte(batches.producedOn, query.producedFrom) : undefined,
      query.producedTo ? lte(batches.producedOn, query.producedTo) : undefined,
      textSearch(query.q, [batches.lotCode, batches.notes, coatings.code, coatings.name]),
    ],
    sort: SORT_COLUMNS[query.sort],
    query,
  });
}

/** A batch of the organization with its coating; null when there is none. */
export async function findBatchWithCoating(organizationId: string, batchId: string) {
  const [row] = await database()
    .select({
      id: batches.id,
      lotCode: batches.lotCode,
      producedOn: batches.producedOn,
      process: batches.process,
      notes: batches.notes,
      coatingId: coatings.id,
      coatingCode: coatings.code,
      coatingName: coatings.name,
      coatingDescription: coatings.description,
    })
    .from(batches)
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .where(and(eq(batches.id, batchId), eq(batches.organizationId, organizationId)));
  return row ?? null;
}
