import 'server-only';
import { findBatchVerdict } from '@/db/queries/alerts';
import { listDropsWithLatest, revisionsOfDrop, type DropFilters } from '@/db/queries/drops';
import { findReview, listReviews } from '@/db/queries/reviews';
import { database } from '@/db/queries/transaction';
import { notFound } from '@/lib/app-error';
import {
  encodeCursor,
  pagePosition,
  v1ReviewSchema,
  type CursorPage,
  type V1Drop,
} from '@/lib/contracts/api-v1';
import { batchRecords } from '../records/kinds';
import { getRecord } from '../records/get';
import type { AnyRecordKind, ListItemOf } from '../records/kind';
import { listRecords } from '../records/list';

/*
 * What the versioned API reads: the records service for lab records, the drop, review and
 * verdict queries for results, each page with a cursor (lib/contracts/api-v1.ts). Tokens that
 * read have `results:read-all`, so every revision is listed whatever its review status.
 */

type CursorQuery = { cursor?: string; limit?: number };

/** Fetches one more row than the page holds, to know whether another page follows. */
async function cursorPage<T>(
  query: CursorQuery,
  fetch: (position: { offset: number; limit: number }) => Promise<T[]>,
): Promise<CursorPage<T>> {
  const { offset, limit } = pagePosition(query);
  const rows = await fetch({ offset, limit: limit + 1 });
  return {
    items: rows.slice(0, limit),
    nextCursor: rows.length > limit ? encodeCursor({ offset: offset + limit, limit }) : null,
  };
}

/** A page of a kind of lab record, with that list's filters and sort. */
export async function listRecordsPage<K extends AnyRecordKind>(
  kind: K,
  organizationId: string,
  query: CursorQuery & Record<string, unknown>,
): Promise<CursorPage<ListItemOf<K>>> {
  const { cursor: _cursor, limit: _limit, ...filters } = query;
  const { offset, limit } = pagePosition(query);
  const page = await listRecords(kind, organizationId, {
    ...filters,
    page: offset / limit + 1,
    pageSize: limit,
  } as never);
  return {
    items: page.items,
    nextCursor:
      offset + limit < page.total ? encodeCursor({ offset: offset + limit, limit }) : null,
  };
}

export async function listDrops(
  organizationId: string,
  query: CursorQuery & Omit<DropFilters, 'dropId'>,
): Promise<CursorPage<V1Drop>> {
  const { cursor: _cursor, limit: _limit, ...filters } = query;
  return cursorPage(
    query,
    (position) => listDropsWithLatest(organizationId, filters, position) as Promise<V1Drop[]>,
  );
}

/** A drop with every analysis revision (newest first). */
export async function getDrop(organizationId: string, dropId: string) {
  const [drop] = await listDropsWithLatest(organizationId, { dropId }, { offset: 0, limit: 1 });
  if (!drop) throw notFound('That drop');
  return { ...(drop as V1Drop), revisions: await revisionsOfDrop(drop.id) };
}

export async function listReviewsPage(
  organizationId: string,
  query: CursorQuery & { status?: 'submitted' | 'decided' },
) {
  return cursorPage(query, async (position) =>
    (await listReviews(organizationId, query.status, position)).map((row) =>
      v1ReviewSchema.parse(row),
    ),
  );
}

export async function getReview(organizationId: string, reviewId: string) {
  const review = await findReview(organizationId, reviewId);
  if (!review) throw notFound('That review');
  return v1ReviewSchema.parse(review);
}

/** The batch's stored verdict (null until a result was saved under it). */
export async function getBatchVerdict(organizationId: string, batchId: string) {
  await getRecord(batchRecords, organizationId, batchId);
  return { batchId, outcome: await findBatchVerdict(database(), batchId) };
}
