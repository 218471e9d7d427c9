import 'server-only';
import { and, asc, count, desc, eq, getTableColumns, isNull, sql } from 'drizzle-orm';
import { notFound } from '@/lib/api/errors';
import type {
  ArchiveOrDeleteQuery,
  SampleCreate,
  SampleListQuery,
  SampleUpdate,
} from '@/lib/validation/records';
import { getDb } from '../client';
import { batches, drops, samples } from '../schema';
import { newId } from './ids';
import {
  assertEditable,
  assertVersionIfGiven,
  auditChange,
  duplicate,
  failedUpdate,
  offsetOf,
  requireBatchReference,
  textSearch,
  withDuplicateCheck,
  type Actor,
  type DeleteOutcome,
  type Executor,
  type Page,
} from './records';

export type Sample = typeof samples.$inferSelect;
/** A sample in a list, with its batch's lot code and coating. */
export type SampleListItem = Sample & { batchLotCode: string; coatingId: string };

const ENTITY = 'sample';
const SORT_COLUMNS = {
  label: samples.label,
  treatedAt: samples.treatedAt,
  createdAt: samples.createdAt,
  updatedAt: samples.updatedAt,
} as const;

const UNIQUE = {
  samples_batch_label_unique: () =>
    duplicate(
      'label',
      'Another sample of this batch already has this label. Use a different label.',
    ),
};

const toDate = (value: string | null | undefined) =>
  value === undefined ? undefined : value === null ? null : new Date(value);

export async function listSamples(
  organizationId: string,
  query: SampleListQuery,
): Promise<Page<SampleListItem>> {
  const where = and(
    eq(samples.organizationId, organizationId),
    query.includeArchived ? undefined : isNull(samples.archivedAt),
    query.batchId ? eq(samples.batchId, query.batchId) : undefined,
    query.coatingId ? eq(batches.coatingId, query.coatingId) : undefined,
    textSearch(query.q, [samples.label, samples.substrate, samples.position, samples.notes]),
  );
  const order = query.dir === 'asc' ? asc : desc;
  const db = getDb();
  const [items, [{ total }]] = await Promise.all([
    db
      .select({
        ...getTableColumns(samples),
        batchLotCode: batches.lotCode,
        coatingId: batches.coatingId,
      })
      .from(samples)
      .innerJoin(batches, eq(batches.id, samples.batchId))
      .where(where)
      .orderBy(order(SORT_COLUMNS[query.sort]), asc(samples.id))
      .limit(query.pageSize)
      .offset(offsetOf(query)),
    db
      .select({ total: count() })
      .from(samples)
      .innerJoin(batches, eq(batches.id, samples.batchId))
      .where(where),
  ]);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

async function findSample(db: Executor, organizationId: string, id: string) {
  const [row] = await db
    .select()
    .from(samples)
    .where(and(eq(samples.id, id), eq(samples.organizationId, organizationId)));
  return row;
}

export async function getSample(organizationId: string, id: string): Promise<Sample> {
  const row = await findSample(getDb(), organizationId, id);
  if (!row) throw notFound('That sample');
  return row;
}

export async function createSample(actor: Actor, input: SampleCreate): Promise<Sample> {
  return withDuplicateCheck(
    () =>
      getDb().transaction(async (tx) => {
        await requireBatchReference(tx, actor.organizationId, input.batchId);
        const [row] = await tx
          .insert(samples)
          .values({
            id: newId(),
            organizationId: actor.organizationId,
            batchId: input.batchId,
            label: input.label,
            substrate: input.substrate ?? '',
            position: input.position ?? '',
            treatedAt: toDate(input.treatedAt) ?? null,
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

export async function updateSample(actor: Actor, id: string, input: SampleUpdate): Promise<Sample> {
  const { version, treatedAt, ...changes } = input;
  return withDuplicateCheck(
    () =>
      getDb().transaction(async (tx) => {
        const before = await findSample(tx, actor.organizationId, id);
        assertEditable(ENTITY, before, version);
        if (changes.batchId !== undefined && changes.batchId !== before.batchId) {
          await requireBatchReference(tx, actor.organizationId, changes.batchId);
        }
        const [row] = await tx
          .update(samples)
          .set({
            ...changes,
            treatedAt: toDate(treatedAt),
            version: sql`${samples.version} + 1`,
            updatedAt: sql`now()`,
          })
          .where(
            and(
              eq(samples.id, id),
              eq(samples.organizationId, actor.organizationId),
              eq(samples.version, version),
              isNull(samples.archivedAt),
            ),
          )
          .returning();
        if (!row) throw failedUpdate(ENTITY, await findSample(tx, actor.organizationId, id));
        await auditChange(tx, ENTITY, actor, 'update', id, before, row);
        return row;
      }),
    UNIQUE,
  );
}

/** Archives a sample that has drops under it; deletes one that has none. */
export async function archiveOrDeleteSample(
  actor: Actor,
  id: string,
  options: ArchiveOrDeleteQuery,
): Promise<DeleteOutcome<Sample>> {
  return getDb().transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(samples)
      .where(and(eq(samples.id, id), eq(samples.organizationId, actor.organizationId)))
      .for('update');
    if (!before) throw notFound('That sample');
    assertVersionIfGiven(ENTITY, before, options.version);
    const [drop] = await tx
      .select({ id: drops.id })
      .from(drops)
      .where(eq(drops.sampleId, id))
      .limit(1);
    if (drop || options.mode === 'archive') {
      if (before.archivedAt) return { outcome: 'archived', record: before };
      const [row] = await tx
        .update(samples)
        .set({
          archivedAt: sql`now()`,
          version: sql`${samples.version} + 1`,
          updatedAt: sql`now()`,
        })
        .where(eq(samples.id, id))
        .returning();
      await auditChange(tx, ENTITY, actor, 'archive', id, before, row);
      return { outcome: 'archived', record: row };
    }
    await tx.delete(samples).where(eq(samples.id, id));
    await auditChange(tx, ENTITY, actor, 'delete', id, before, null);
    return { outcome: 'deleted', record: before };
  });
}
