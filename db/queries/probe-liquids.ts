import 'server-only';
import { and, asc, count, desc, eq, isNull, sql } from 'drizzle-orm';
import { HttpError, notFound } from '@/lib/api/errors';
import {
  checkProbeLiquidComponents,
  type ArchiveOrDeleteQuery,
  type ProbeLiquidCreate,
  type ProbeLiquidListQuery,
  type ProbeLiquidUpdate,
} from '@/lib/validation/records';
import { getDb } from '../client';
import { drops, measurementSessions, probeLiquids, specs } from '../schema';
import { newId } from './ids';
import {
  assertEditable,
  assertVersionIfGiven,
  auditChange,
  failedUpdate,
  offsetOf,
  probeLiquidVisibleTo,
  textSearch,
  withoutUndefined,
  type Actor,
  type DeleteOutcome,
  type Executor,
  type Page,
} from './records';

type ProbeLiquidRow = typeof probeLiquids.$inferSelect;
/** A probe liquid as the API returns it; `builtIn` marks the read-only library entries. */
export type ProbeLiquid = ProbeLiquidRow & { builtIn: boolean };

const ENTITY = 'probe_liquid';
const SORT_COLUMNS = {
  name: probeLiquids.name,
  totalMnM: probeLiquids.totalMnM,
  createdAt: probeLiquids.createdAt,
} as const;

const withOrigin = (row: ProbeLiquidRow): ProbeLiquid => ({
  ...row,
  builtIn: row.organizationId === null,
});

const readOnly = () =>
  new HttpError(
    403,
    'read_only',
    'Built-in probe liquids are shared by every organization and cannot be changed. Add your own probe liquid with the values you need.',
  );

/** The built-in library and the organization's own liquids. Query `origin`: all, built-in, own. */
export async function listProbeLiquids(
  organizationId: string,
  query: ProbeLiquidListQuery,
): Promise<Page<ProbeLiquid>> {
  const origin =
    query.origin === 'built-in'
      ? isNull(probeLiquids.organizationId)
      : query.origin === 'own'
        ? eq(probeLiquids.organizationId, organizationId)
        : probeLiquidVisibleTo(organizationId);
  const where = and(
    origin,
    query.includeArchived ? undefined : isNull(probeLiquids.archivedAt),
    textSearch(query.q, [probeLiquids.name]),
  );
  const order = query.dir === 'asc' ? asc : desc;
  const db = getDb();
  const [rows, [{ total }]] = await Promise.all([
    db
      .select()
      .from(probeLiquids)
      .where(where)
      .orderBy(order(SORT_COLUMNS[query.sort]), asc(probeLiquids.id))
      .limit(query.pageSize)
      .offset(offsetOf(query)),
    db.select({ total: count() }).from(probeLiquids).where(where),
  ]);
  return { items: rows.map(withOrigin), total, page: query.page, pageSize: query.pageSize };
}

async function findVisible(db: Executor, organizationId: string, id: string, lock = false) {
  const query = db
    .select()
    .from(probeLiquids)
    .where(and(eq(probeLiquids.id, id), probeLiquidVisibleTo(organizationId)));
  const [row] = lock ? await query.for('update') : await query;
  return row;
}

export async function getProbeLiquid(organizationId: string, id: string): Promise<ProbeLiquid> {
  const row = await findVisible(getDb(), organizationId, id);
  if (!row) throw notFound('That probe liquid');
  return withOrigin(row);
}

export async function createProbeLiquid(
  actor: Actor,
  input: ProbeLiquidCreate,
): Promise<ProbeLiquid> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .insert(probeLiquids)
      .values({
        id: newId(),
        organizationId: actor.organizationId,
        name: input.name,
        totalMnM: input.totalMnM,
        dispersiveMnM: input.dispersiveMnM ?? null,
        polarMnM: input.polarMnM ?? null,
        lifshitzVanDerWaalsMnM: input.lifshitzVanDerWaalsMnM ?? null,
        acidMnM: input.acidMnM ?? null,
        baseMnM: input.baseMnM ?? null,
        densityGPerCm3: input.densityGPerCm3 ?? null,
        sources: input.sources ?? {},
        hazardNote: input.hazardNote ?? null,
      })
      .returning();
    await auditChange(tx, ENTITY, actor, 'create', row.id, null, row);
    return withOrigin(row);
  });
}

export async function updateProbeLiquid(
  actor: Actor,
  id: string,
  input: ProbeLiquidUpdate,
): Promise<ProbeLiquid> {
  const { version, ...changes } = input;
  return getDb().transaction(async (tx) => {
    const stored = await findVisible(tx, actor.organizationId, id);
    if (stored && stored.organizationId === null) throw readOnly();
    const before = stored && withOrigin(stored);
    assertEditable(ENTITY, before, version);
    // Components must add up for the liquid as it will be, not only for the fields sent.
    checkProbeLiquidComponents({ ...before, ...withoutUndefined(changes) });
    const [row] = await tx
      .update(probeLiquids)
      .set({ ...changes, version: sql`${probeLiquids.version} + 1`, updatedAt: sql`now()` })
      .where(
        and(
          eq(probeLiquids.id, id),
          eq(probeLiquids.organizationId, actor.organizationId),
          eq(probeLiquids.version, version),
          isNull(probeLiquids.archivedAt),
        ),
      )
      .returning();
    if (!row) {
      const current = await findVisible(tx, actor.organizationId, id);
      throw failedUpdate(ENTITY, current && withOrigin(current));
    }
    await auditChange(tx, ENTITY, actor, 'update', id, before, row);
    return withOrigin(row);
  });
}

/** Archives a liquid that specs, sessions or drops refer to; deletes one nothing refers to. */
export async function archiveOrDeleteProbeLiquid(
  actor: Actor,
  id: string,
  options: ArchiveOrDeleteQuery,
): Promise<DeleteOutcome<ProbeLiquid>> {
  return getDb().transaction(async (tx) => {
    const before = await findVisible(tx, actor.organizationId, id, true);
    if (!before) throw notFound('That probe liquid');
    if (before.organizationId === null) throw readOnly();
    assertVersionIfGiven(ENTITY, withOrigin(before), options.version);
    const [spec] = await tx
      .select({ id: specs.id })
      .from(specs)
      .where(eq(specs.probeLiquidId, id))
      .limit(1);
    const [drop] = await tx
      .select({ id: drops.id })
      .from(drops)
      .where(eq(drops.probeLiquidId, id))
      .limit(1);
    const [session] = await tx
      .select({ id: measurementSessions.id })
      .from(measurementSessions)
      .where(eq(measurementSessions.probeLiquidId, id))
      .limit(1);
    if (spec || drop || session || options.mode === 'archive') {
      if (before.archivedAt) return { outcome: 'archived', record: withOrigin(before) };
      const [row] = await tx
        .update(probeLiquids)
        .set({
          archivedAt: sql`now()`,
          version: sql`${probeLiquids.version} + 1`,
          updatedAt: sql`now()`,
        })
        .where(eq(probeLiquids.id, id))
        .returning();
      await auditChange(tx, ENTITY, actor, 'archive', id, before, row);
      return { outcome: 'archived', record: withOrigin(row) };
    }
    await tx.delete(probeLiquids).where(eq(probeLiquids.id, id));
    await auditChange(tx, ENTITY, actor, 'delete', id, before, null);
    return { outcome: 'deleted', record: withOrigin(before) };
  });
}
