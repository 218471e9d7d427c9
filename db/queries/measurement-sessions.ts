import 'server-only';
import { and, asc, count, desc, eq, getTableColumns, gte, isNull, lt, sql } from 'drizzle-orm';
import { notFound } from '@/lib/api/errors';
import type {
  ArchiveOrDeleteQuery,
  MeasurementSessionCreate,
  MeasurementSessionListQuery,
  MeasurementSessionUpdate,
} from '@/lib/validation/records';
import { getDb } from '../client';
import { drops, measurementSessions, probeLiquids } from '../schema';
import { newId } from './ids';
import {
  assertEditable,
  assertVersionIfGiven,
  auditChange,
  failedUpdate,
  offsetOf,
  requireProbeLiquidReference,
  textSearch,
  type Actor,
  type DeleteOutcome,
  type Executor,
  type Page,
} from './records';

export type MeasurementSession = typeof measurementSessions.$inferSelect;
/** A session in a list, with its probe liquid's name (null when none was set). */
export type MeasurementSessionListItem = MeasurementSession & { probeLiquidName: string | null };

const ENTITY = 'measurement_session';
const SORT_COLUMNS = {
  measuredAt: measurementSessions.measuredAt,
  operatorName: measurementSessions.operatorName,
  createdAt: measurementSessions.createdAt,
} as const;

const DAY_MS = 86_400_000;
/** Date filters are whole UTC days: from the start of `from` to the end of `to`. */
const startOfUtcDay = (isoDate: string) => new Date(`${isoDate}T00:00:00Z`);

export async function listMeasurementSessions(
  organizationId: string,
  query: MeasurementSessionListQuery,
): Promise<Page<MeasurementSessionListItem>> {
  const where = and(
    eq(measurementSessions.organizationId, organizationId),
    query.includeArchived ? undefined : isNull(measurementSessions.archivedAt),
    query.probeLiquidId ? eq(measurementSessions.probeLiquidId, query.probeLiquidId) : undefined,
    query.measuredFrom
      ? gte(measurementSessions.measuredAt, startOfUtcDay(query.measuredFrom))
      : undefined,
    query.measuredTo
      ? lt(
          measurementSessions.measuredAt,
          new Date(startOfUtcDay(query.measuredTo).getTime() + DAY_MS),
        )
      : undefined,
    textSearch(query.q, [measurementSessions.operatorName, measurementSessions.instrumentNotes]),
  );
  const order = query.dir === 'asc' ? asc : desc;
  const db = getDb();
  const [items, [{ total }]] = await Promise.all([
    db
      .select({ ...getTableColumns(measurementSessions), probeLiquidName: probeLiquids.name })
      .from(measurementSessions)
      .leftJoin(probeLiquids, eq(probeLiquids.id, measurementSessions.probeLiquidId))
      .where(where)
      .orderBy(order(SORT_COLUMNS[query.sort]), asc(measurementSessions.id))
      .limit(query.pageSize)
      .offset(offsetOf(query)),
    db.select({ total: count() }).from(measurementSessions).where(where),
  ]);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

async function findSession(db: Executor, organizationId: string, id: string) {
  const [row] = await db
    .select()
    .from(measurementSessions)
    .where(
      and(eq(measurementSessions.id, id), eq(measurementSessions.organizationId, organizationId)),
    );
  return row;
}

export async function getMeasurementSession(
  organizationId: string,
  id: string,
): Promise<MeasurementSession> {
  const row = await findSession(getDb(), organizationId, id);
  if (!row) throw notFound('That measurement session');
  return row;
}

export async function createMeasurementSession(
  actor: Actor,
  input: MeasurementSessionCreate,
): Promise<MeasurementSession> {
  return getDb().transaction(async (tx) => {
    if (input.probeLiquidId)
      await requireProbeLiquidReference(tx, actor.organizationId, input.probeLiquidId);
    const [row] = await tx
      .insert(measurementSessions)
      .values({
        id: newId(),
        organizationId: actor.organizationId,
        operatorName: input.operatorName,
        measuredAt: new Date(input.measuredAt),
        probeLiquidId: input.probeLiquidId ?? null,
        temperatureC: input.temperatureC,
        humidityPct: input.humidityPct,
        dropVolumeUl: input.dropVolumeUl,
        scalePxPerMm: input.scalePxPerMm,
        instrumentNotes: input.instrumentNotes ?? '',
        createdByUserId: actor.userId,
      })
      .returning();
    await auditChange(tx, ENTITY, actor, 'create', row.id, null, row);
    return row;
  });
}

export async function updateMeasurementSession(
  actor: Actor,
  id: string,
  input: MeasurementSessionUpdate,
): Promise<MeasurementSession> {
  const { version, measuredAt, ...changes } = input;
  return getDb().transaction(async (tx) => {
    const before = await findSession(tx, actor.organizationId, id);
    assertEditable(ENTITY, before, version);
    if (changes.probeLiquidId && changes.probeLiquidId !== before.probeLiquidId) {
      await requireProbeLiquidReference(tx, actor.organizationId, changes.probeLiquidId);
    }
    const [row] = await tx
      .update(measurementSessions)
      .set({
        ...changes,
        measuredAt: measuredAt === undefined ? undefined : new Date(measuredAt),
        version: sql`${measurementSessions.version} + 1`,
        updatedAt: sql`now()`,
      })
      .where(
        and(
          eq(measurementSessions.id, id),
          eq(measurementSessions.organizationId, actor.organizationId),
          eq(measurementSessions.version, version),
          isNull(measurementSessions.archivedAt),
        ),
      )
      .returning();
    if (!row) throw failedUpdate(ENTITY, await findSession(tx, actor.organizationId, id));
    await auditChange(tx, ENTITY, actor, 'update', id, before, row);
    return row;
  });
}

/** Archives a session that has drops under it; deletes one that has none. */
export async function archiveOrDeleteMeasurementSession(
  actor: Actor,
  id: string,
  options: ArchiveOrDeleteQuery,
): Promise<DeleteOutcome<MeasurementSession>> {
  return getDb().transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(measurementSessions)
      .where(
        and(
          eq(measurementSessions.id, id),
          eq(measurementSessions.organizationId, actor.organizationId),
        ),
      )
      .for('update');
    if (!before) throw notFound('That measurement session');
    assertVersionIfGiven(ENTITY, before, options.version);
    const [drop] = await tx
      .select({ id: drops.id })
      .from(drops)
      .where(eq(drops.sessionId, id))
      .limit(1);
    if (drop || options.mode === 'archive') {
      if (before.archivedAt) return { outcome: 'archived', record: before };
      const [row] = await tx
        .update(measurementSessions)
        .set({
          archivedAt: sql`now()`,
          version: sql`${measurementSessions.version} + 1`,
          updatedAt: sql`now()`,
        })
        .where(eq(measurementSessions.id, id))
        .returning();
      await auditChange(tx, ENTITY, actor, 'archive', id, before, row);
      return { outcome: 'archived', record: row };
    }
    await tx.delete(measurementSessions).where(eq(measurementSessions.id, id));
    await auditChange(tx, ENTITY, actor, 'delete', id, before, null);
    return { outcome: 'deleted', record: before };
  });
}
