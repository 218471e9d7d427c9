import 'server-only';
import { and, asc, count, desc, eq, getTableColumns, gte, isNull, lte, sql } from 'drizzle-orm';
import { notFound } from '@/lib/api/errors';
import type {
  ArchiveOrDeleteQuery,
  BatchCreate,
  BatchListQuery,
  BatchUpdate,
} from '@/lib/validation/records';
import { getDb } from '../client';
import { batches, coatings, samples } from '../schema';
import { newId } from './ids';
import {
  assertEditable,
  assertVersionIfGiven,
  auditChange,
  duplicate,
  failedUpdate,
  offsetOf,
  requireCoatingReference,
  textSearch,
  withDuplicateCheck,
  type Actor,
  type DeleteOutcome,
  type Executor,
  type Page,
} from './records';

export type Batch = typeof batches.$inferSelect;
/** A batch in a list, with its coating's code and name. */
export type BatchListItem = Batch & { coatingCode: string; coatingName: string };

const ENTITY = 'batch';
const SORT_COLUMNS = {
  producedOn: batches.producedOn,
  lotCode: batches.lotCode,
  createdAt: batches.createdAt,
  updatedAt: batches.updatedAt,
} as const;

const UNIQUE = {
  batches_org_lot_unique: () =>
    duplicate(
      'lotCode',
      'Another batch in this organization already has this lot code. Use a different lot code.',
    ),
};

export async function listBatches(
  organizationId: string,
  query: BatchListQuery,
): Promise<Page<BatchListItem>> {
  const where = and(
    eq(batches.organizationId, organizationId),
    query.includeArchived ? undefined : isNull(batches.archivedAt),
    query.coatingId ? eq(batches.coatingId, query.coatingId) : undefined,
    query.producedFrom ? gte(batches.producedOn, query.producedFrom) : undefined,
    query.producedTo ? lte(batches.producedOn, query.producedTo) : undefined,
    textSearch(query.q, [batches.lotCode, batches.notes, coatings.code, coatings.name]),
  );
  const order = query.dir === 'asc' ? asc : desc;
  const db = getDb();
  const [items, [{ total }]] = await Promise.all([
    db
      .select({
        ...getTableColumns(batches),
        coatingCode: coatings.code,
        coatingName: coatings.name,
      })
      .from(batches)
      .innerJoin(coatings, eq(coatings.id, batches.coatingId))
      .where(where)
      .orderBy(order(SORT_COLUMNS[query.sort]), asc(batches.id))
      .limit(query.pageSize)
      .offset(offsetOf(query)),
    db
      .select({ total: count() })
      .from(batches)
      .innerJoin(coatings, eq(coatings.id, batches.coatingId))
      .where(where),
  ]);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

async function findBatch(db: Executor, organizationId: string, id: string) {
  const [row] = await db
    .select()
    .from(batches)
    .where(and(eq(batches.id, id), eq(batches.organizationId, organizationId)));
  return row;
}

export async function getBatch(organizationId: string, id: string): Promise<Batch> {
  const row = await findBatch(getDb(), organizationId, id);
  if (!row) throw notFound('That batch');
  return row;
}

export async function createBatch(actor: Actor, input: BatchCreate): Promise<Batch> {
  return withDuplicateCheck(
    () =>
      getDb().transaction(async (tx) => {
        await requireCoatingReference(tx, actor.organizationId, input.coatingId);
        const [row] = await tx
          .insert(batches)
          .values({
            id: newId(),
            organizationId: actor.organizationId,
            coatingId: input.coatingId,
            lotCode: input.lotCode,
            producedOn: input.producedOn,
            process: input.process ?? {},
            notes: input.notes ?? '',
            createdByUserId: actor.userId,
          })
          .returning();
        await auditChange(tx, ENTITY, actor, 'create', row.id, null, row);
        return row;
      }),
    UNIQUE,
  );
}

/** `process`, when sent, replaces the stored parameters as a whole. */
export async function updateBatch(actor: Actor, id: string, input: BatchUpdate): Promise<Batch> {
  const { version, ...changes } = input;
  return withDuplicateCheck(
    () =>
      getDb().transaction(async (tx) => {
        const before = await findBatch(tx, actor.organizationId, id);
        assertEditable(ENTITY, before, version);
        if (changes.coatingId !== undefined && changes.coatingId !== before.coatingId) {
          await requireCoatingReference(tx, actor.organizationId, changes.coatingId);
        }
        const [row] = await tx
          .update(batches)
          .set({ ...changes, version: sql`${batches.version} + 1`, updatedAt: sql`now()` })
          .where(
            and(
              eq(batches.id, id),
              eq(batches.organizationId, actor.organizationId),
              eq(batches.version, version),
              isNull(batches.archivedAt),
            ),
          )
          .returning();
        if (!row) throw failedUpdate(ENTITY, await findBatch(tx, actor.organizationId, id));
        await auditChange(tx, ENTITY, actor, 'update', id, before, row);
        return row;
      }),
    UNIQUE,
  );
}

/** Archives a batch that has samples under it; deletes one that has none. */
export async function archiveOrDeleteBatch(
  actor: Actor,
  id: string,
  options: ArchiveOrDeleteQuery,
): Promise<DeleteOutcome<Batch>> {
  return getDb().transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(batches)
      .where(and(eq(batches.id, id), eq(batches.organizationId, actor.organizationId)))
      .for('update');
    if (!before) throw notFound('That batch');
    assertVersionIfGiven(ENTITY, before, options.version);
    const [sample] = await tx
      .select({ id: samples.id })
      .from(samples)
      .where(eq(samples.batchId, id))
      .limit(1);
    if (sample || options.mode === 'archive') {
      if (before.archivedAt) return { outcome: 'archived', record: before };
      const [row] = await tx
        .update(batches)
        .set({
          archivedAt: sql`now()`,
          version: sql`${batches.version} + 1`,
          updatedAt: sql`now()`,
        })
        .where(eq(batches.id, id))
        .returning();
      await auditChange(tx, ENTITY, actor, 'archive', id, before, row);
      return { outcome: 'archived', record: row };
    }
    await tx.delete(batches).where(eq(batches.id, id));
    await auditChange(tx, ENTITY, actor, 'delete', id, before, null);
    return { outcome: 'deleted', record: before };
  });
}
