import 'server-only';
import { and, asc, count, desc, eq, isNull, sql } from 'drizzle-orm';
import { notFound } from '@/lib/api/errors';
import type {
  ArchiveOrDeleteQuery,
  CoatingCreate,
  CoatingListQuery,
  CoatingUpdate,
} from '@/lib/validation/records';
import { getDb } from '../client';
import { batches, coatings, specs } from '../schema';
import { newId } from './ids';
import {
  assertEditable,
  auditChange,
  assertVersionIfGiven,
  duplicate,
  failedUpdate,
  offsetOf,
  textSearch,
  withDuplicateCheck,
  type Actor,
  type DeleteOutcome,
  type Page,
  type Executor,
} from './records';

export type Coating = typeof coatings.$inferSelect;

const ENTITY = 'coating';
const SORT_COLUMNS = {
  code: coatings.code,
  name: coatings.name,
  createdAt: coatings.createdAt,
  updatedAt: coatings.updatedAt,
} as const;

const duplicateCode = () =>
  duplicate(
    'code',
    'Another coating in this organization already has this code. Use a different code.',
  );
const UNIQUE = { coatings_org_code_unique: duplicateCode };

export async function listCoatings(
  organizationId: string,
  query: CoatingListQuery,
): Promise<Page<Coating>> {
  const where = and(
    eq(coatings.organizationId, organizationId),
    query.includeArchived ? undefined : isNull(coatings.archivedAt),
    textSearch(query.q, [coatings.code, coatings.name, coatings.description]),
  );
  const order = query.dir === 'asc' ? asc : desc;
  const db = getDb();
  const [items, [{ total }]] = await Promise.all([
    db
      .select()
      .from(coatings)
      .where(where)
      .orderBy(order(SORT_COLUMNS[query.sort]), asc(coatings.id))
      .limit(query.pageSize)
      .offset(offsetOf(query)),
    db.select({ total: count() }).from(coatings).where(where),
  ]);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

async function findCoating(db: Executor, organizationId: string, id: string) {
  const [row] = await db
    .select()
    .from(coatings)
    .where(and(eq(coatings.id, id), eq(coatings.organizationId, organizationId)));
  return row;
}

export async function getCoating(organizationId: string, id: string): Promise<Coating> {
  const row = await findCoating(getDb(), organizationId, id);
  if (!row) throw notFound('That coating');
  return row;
}

export async function createCoating(actor: Actor, input: CoatingCreate): Promise<Coating> {
  return withDuplicateCheck(
    () =>
      getDb().transaction(async (tx) => {
        const [row] = await tx
          .insert(coatings)
          .values({
            id: newId(),
            organizationId: actor.organizationId,
            code: input.code,
            name: input.name,
            description: input.description ?? '',
            createdByUserId: actor.userId,
          })
          .returning();
        await auditChange(tx, ENTITY, actor, 'create', row.id, null, row);
        return row;
      }),
    UNIQUE,
  );
}

export async function updateCoating(
  actor: Actor,
  id: string,
  input: CoatingUpdate,
): Promise<Coating> {
  const { version, ...changes } = input;
  return withDuplicateCheck(
    () =>
      getDb().transaction(async (tx) => {
        const before = await findCoating(tx, actor.organizationId, id);
        assertEditable(ENTITY, before, version);
        const [row] = await tx
          .update(coatings)
          .set({ ...changes, version: sql`${coatings.version} + 1`, updatedAt: sql`now()` })
          .where(
            and(
              eq(coatings.id, id),
              eq(coatings.organizationId, actor.organizationId),
              eq(coatings.version, version),
              isNull(coatings.archivedAt),
            ),
          )
          .returning();
        if (!row) throw failedUpdate(ENTITY, await findCoating(tx, actor.organizationId, id));
        await auditChange(tx, ENTITY, actor, 'update', id, before, row);
        return row;
      }),
    UNIQUE,
  );
}

/** Archives a coating that has batches or specs under it; deletes one that has none. */
export async function archiveOrDeleteCoating(
  actor: Actor,
  id: string,
  options: ArchiveOrDeleteQuery,
): Promise<DeleteOutcome<Coating>> {
  return getDb().transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(coatings)
      .where(and(eq(coatings.id, id), eq(coatings.organizationId, actor.organizationId)))
      .for('update');
    if (!before) throw notFound('That coating');
    assertVersionIfGiven(ENTITY, before, options.version);
    const [batch] = await tx
      .select({ id: batches.id })
      .from(batches)
      .where(eq(batches.coatingId, id))
      .limit(1);
    const [spec] = await tx
      .select({ id: specs.id })
      .from(specs)
      .where(eq(specs.coatingId, id))
      .limit(1);
    if (batch || spec || options.mode === 'archive') {
      if (before.archivedAt) return { outcome: 'archived', record: before };
      const [row] = await tx
        .update(coatings)
        .set({
          archivedAt: sql`now()`,
          version: sql`${coatings.version} + 1`,
          updatedAt: sql`now()`,
        })
        .where(eq(coatings.id, id))
        .returning();
      await auditChange(tx, ENTITY, actor, 'archive', id, before, row);
      return { outcome: 'archived', record: row };
    }
    await tx.delete(coatings).where(eq(coatings.id, id));
    await auditChange(tx, ENTITY, actor, 'delete', id, before, null);
    return { outcome: 'deleted', record: before };
  });
}
