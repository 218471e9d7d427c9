import 'server-only';
import { and, asc, count, desc, eq, getTableColumns, isNull, sql } from 'drizzle-orm';
import { notFound } from '@/lib/api/errors';
import {
  checkSpecLimits,
  type ArchiveOrDeleteQuery,
  type SpecCreate,
  type SpecListQuery,
  type SpecUpdate,
} from '@/lib/validation/records';
import { getDb } from '../client';
import { coatings, probeLiquids, specs } from '../schema';
import { newId } from './ids';
import {
  assertEditable,
  assertVersionIfGiven,
  auditChange,
  failedUpdate,
  offsetOf,
  requireCoatingReference,
  requireProbeLiquidReference,
  textSearch,
  type Actor,
  type DeleteOutcome,
  type Executor,
  type Page,
  withoutUndefined,
} from './records';

export type Spec = typeof specs.$inferSelect;
/** A spec in a list, with its coating's code and its probe liquid's name. */
export type SpecListItem = Spec & { coatingCode: string; probeLiquidName: string };

const ENTITY = 'spec';
const SORT_COLUMNS = {
  createdAt: specs.createdAt,
  updatedAt: specs.updatedAt,
  minDeg: specs.minDeg,
  maxDeg: specs.maxDeg,
  scope: specs.scope,
} as const;

export async function listSpecs(
  organizationId: string,
  query: SpecListQuery,
): Promise<Page<SpecListItem>> {
  const where = and(
    eq(specs.organizationId, organizationId),
    query.includeArchived ? undefined : isNull(specs.archivedAt),
    query.coatingId ? eq(specs.coatingId, query.coatingId) : undefined,
    query.probeLiquidId ? eq(specs.probeLiquidId, query.probeLiquidId) : undefined,
    textSearch(query.q, [specs.note, coatings.code, probeLiquids.name]),
  );
  const order = query.dir === 'asc' ? asc : desc;
  const db = getDb();
  const [items, [{ total }]] = await Promise.all([
    db
      .select({
        ...getTableColumns(specs),
        coatingCode: coatings.code,
        probeLiquidName: probeLiquids.name,
      })
      .from(specs)
      .innerJoin(coatings, eq(coatings.id, specs.coatingId))
      .innerJoin(probeLiquids, eq(probeLiquids.id, specs.probeLiquidId))
      .where(where)
      .orderBy(order(SORT_COLUMNS[query.sort]), asc(specs.id))
      .limit(query.pageSize)
      .offset(offsetOf(query)),
    db
      .select({ total: count() })
      .from(specs)
      .innerJoin(coatings, eq(coatings.id, specs.coatingId))
      .innerJoin(probeLiquids, eq(probeLiquids.id, specs.probeLiquidId))
      .where(where),
  ]);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

async function findSpec(db: Executor, organizationId: string, id: string) {
  const [row] = await db
    .select()
    .from(specs)
    .where(and(eq(specs.id, id), eq(specs.organizationId, organizationId)));
  return row;
}

export async function getSpec(organizationId: string, id: string): Promise<Spec> {
  const row = await findSpec(getDb(), organizationId, id);
  if (!row) throw notFound('That spec');
  return row;
}

export async function createSpec(actor: Actor, input: SpecCreate): Promise<Spec> {
  return getDb().transaction(async (tx) => {
    await requireCoatingReference(tx, actor.organizationId, input.coatingId);
    await requireProbeLiquidReference(tx, actor.organizationId, input.probeLiquidId);
    const [row] = await tx
      .insert(specs)
      .values({
        id: newId(),
        organizationId: actor.organizationId,
        coatingId: input.coatingId,
        probeLiquidId: input.probeLiquidId,
        minDeg: input.minDeg ?? null,
        maxDeg: input.maxDeg ?? null,
        scope: input.scope,
        minSurfaceEnergyMnM: input.minSurfaceEnergyMnM ?? null,
        maxSurfaceEnergyMnM: input.maxSurfaceEnergyMnM ?? null,
        maxDaysSinceTreatment: input.maxDaysSinceTreatment ?? null,
        note: input.note ?? '',
      })
      .returning();
    await auditChange(tx, ENTITY, actor, 'create', row.id, null, row);
    return row;
  });
}

export async function updateSpec(actor: Actor, id: string, input: SpecUpdate): Promise<Spec> {
  const { version, ...changes } = input;
  return getDb().transaction(async (tx) => {
    const before = await findSpec(tx, actor.organizationId, id);
    assertEditable(ENTITY, before, version);
    // The limits rules hold for the record as it will be, not only for the fields sent.
    checkSpecLimits({ ...before, ...withoutUndefined(changes) });
    if (changes.coatingId !== undefined && changes.coatingId !== before.coatingId) {
      await requireCoatingReference(tx, actor.organizationId, changes.coatingId);
    }
    if (changes.probeLiquidId !== undefined && changes.probeLiquidId !== before.probeLiquidId) {
      await requireProbeLiquidReference(tx, actor.organizationId, changes.probeLiquidId);
    }
    const [row] = await tx
      .update(specs)
      .set({ ...changes, version: sql`${specs.version} + 1`, updatedAt: sql`now()` })
      .where(
        and(
          eq(specs.id, id),
          eq(specs.organizationId, actor.organizationId),
          eq(specs.version, version),
          isNull(specs.archivedAt),
        ),
      )
      .returning();
    if (!row) throw failedUpdate(ENTITY, await findSpec(tx, actor.organizationId, id));
    await auditChange(tx, ENTITY, actor, 'update', id, before, row);
    return row;
  });
}

/** Nothing refers to a spec, so DELETE removes it unless ?mode=archive asks to keep it. */
export async function archiveOrDeleteSpec(
  actor: Actor,
  id: string,
  options: ArchiveOrDeleteQuery,
): Promise<DeleteOutcome<Spec>> {
  return getDb().transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(specs)
      .where(and(eq(specs.id, id), eq(specs.organizationId, actor.organizationId)))
      .for('update');
    if (!before) throw notFound('That spec');
    assertVersionIfGiven(ENTITY, before, options.version);
    if (options.mode === 'archive') {
      if (before.archivedAt) return { outcome: 'archived', record: before };
      const [row] = await tx
        .update(specs)
        .set({ archivedAt: sql`now()`, version: sql`${specs.version} + 1`, updatedAt: sql`now()` })
        .where(eq(specs.id, id))
        .returning();
      await auditChange(tx, ENTITY, actor, 'archive', id, before, row);
      return { outcome: 'archived', record: row };
    }
    await tx.delete(specs).where(eq(specs.id, id));
    await auditChange(tx, ENTITY, actor, 'delete', id, before, null);
    return { outcome: 'deleted', record: before };
  });
}
