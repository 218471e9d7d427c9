import 'server-only';
import {
  and,
  asc,
  count,
  desc,
  eq,
  getTableColumns,
  ilike,
  isNull,
  or,
  sql,
  type SQL,
} from 'drizzle-orm';
import type { PgColumn, PgSelect, PgTable } from 'drizzle-orm/pg-core';
import type { Page } from '@/lib/contracts/common';
import { getDb } from '../client';
import { probeLiquids } from '../schema';
import type { Executor } from './transaction';

/*
 * Data access shared by the lab-record tables (coatings, specs, batches, samples, probe liquids,
 * measurement sessions): one list builder (filters, sort, page, total), and find / insert /
 * update-at-version / archive / delete of one row. Plain rows in and out; what a missing,
 * archived or stale row means is decided by the records service (server/records).
 */

/** A table with the columns every lab record has. */
export type RecordTable = PgTable & {
  id: PgColumn;
  organizationId: PgColumn;
  version: PgColumn;
  archivedAt: PgColumn;
  updatedAt: PgColumn;
};

/** `%` `_` and `\` match themselves in the search text. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** Case-insensitive "contains" over several text columns; undefined when there is no search. */
export function textSearch(q: string | undefined, columns: PgColumn[]): SQL | undefined {
  if (!q) return undefined;
  const pattern = containsPattern(q);
  return or(...columns.map((column) => ilike(column, pattern)));
}

/** A probe liquid from the built-in library or the organization's own. */
export function probeLiquidVisibleTo(organizationId: string): SQL {
  return or(
    isNull(probeLiquids.organizationId),
    eq(probeLiquids.organizationId, organizationId),
  ) as SQL;
}

/** The rows of an organization's own table. */
export const ownedBy = (table: RecordTable, organizationId: string): SQL =>
  eq(table.organizationId, organizationId);

export type Join = { kind: 'inner' | 'left'; table: PgTable; on: SQL };

function joinAll(query: PgSelect, joins: Join[]): PgSelect {
  let out = query;
  for (const join of joins) {
    out =
      join.kind === 'inner'
        ? out.innerJoin(join.table, join.on)
        : out.leftJoin(join.table, join.on);
  }
  return out;
}

/** The key of the window total in listPage's rows (no table has such a column). */
const TOTAL = '__listTotal';

/**
 * One page of a list and the total of matching rows: the same joins and filters for both, sorted
 * by `sort` (then by id, so pages never overlap). `columns` are the selected fields. One round
 * trip: the total comes with each row (`count(*) over ()`); only a page past the end, which has
 * no rows to carry it, asks for the count on its own.
 */
export async function listPage<Item>(spec: {
  from: RecordTable;
  columns?: Record<string, PgColumn | SQL.Aliased>;
  joins?: Join[];
  where: (SQL | undefined)[];
  sort: PgColumn;
  query: { dir: 'asc' | 'desc'; page: number; pageSize: number };
}): Promise<Page<Item>> {
  const db = getDb();
  const where = and(...spec.where);
  const order = spec.query.dir === 'asc' ? asc : desc;
  const columns = spec.columns ?? getTableColumns(spec.from);
  const rows = (await joinAll(
    db
      .select({ ...columns, [TOTAL]: sql<number>`count(*) over ()`.mapWith(Number) })
      .from(spec.from)
      .$dynamic(),
    spec.joins ?? [],
  )
    .where(where)
    .orderBy(order(spec.sort), asc(spec.from.id))
    .limit(spec.query.pageSize)
    .offset((spec.query.page - 1) * spec.query.pageSize)) as Record<string, unknown>[];
  let total = Number(rows[0]?.[TOTAL] ?? 0);
  if (rows.length === 0 && spec.query.page > 1) {
    const [counted] = await joinAll(
      db.select({ total: count() }).from(spec.from).$dynamic(),
      spec.joins ?? [],
    ).where(where);
    total = (counted as { total: number } | undefined)?.total ?? 0;
  }
  const items = rows.map(({ [TOTAL]: _total, ...item }) => item as Item);
  return { items, total, page: spec.query.page, pageSize: spec.query.pageSize };
}

/** One record by id within `scope` (the organization's rows, or what it may see); locked on request. */
export async function findRecord<Row>(
  db: Executor,
  table: RecordTable,
  scope: SQL,
  id: string,
  options: { lock?: boolean } = {},
): Promise<Row | undefined> {
  const query = db
    .select()
    .from(table)
    .where(and(eq(table.id, id), scope));
  const [row] = options.lock ? await query.for('update') : await query;
  return row as Row | undefined;
}

export async function insertRecord<Row>(
  db: Executor,
  table: RecordTable,
  values: Record<string, unknown>,
): Promise<Row> {
  const [row] = await db.insert(table).values(values).returning();
  return row as Row;
}

/**
 * Applies `changes` when the record is still at `version` and not archived, raising the version;
 * undefined when no row matched (gone, archived or changed meanwhile).
 */
export async function updateRecordAtVersion<Row>(
  db: Executor,
  table: RecordTable,
  target: { organizationId: string; id: string; version: number },
  changes: Record<string, unknown>,
): Promise<Row | undefined> {
  const [row] = await db
    .update(table)
    .set({ ...changes, version: sql`${table.version} + 1`, updatedAt: sql`now()` })
    .where(
      and(
        eq(table.id, target.id),
        eq(table.organizationId, target.organizationId),
        eq(table.version, target.version),
        isNull(table.archivedAt),
      ),
    )
    .returning();
  return row as Row | undefined;
}

export async function archiveRecord<Row>(
  db: Executor,
  table: RecordTable,
  id: string,
): Promise<Row> {
  const [row] = await db
    .update(table)
    .set({ archivedAt: sql`now()`, version: sql`${table.version} + 1`, updatedAt: sql`now()` })
    .where(eq(table.id, id))
    .returning();
  return row as Row;
}

export async function deleteRecord(db: Executor, table: RecordTable, id: string): Promise<void> {
  await db.delete(table).where(eq(table.id, id));
}

/** Whether any row of `table` has `column` = `value` (records that depend on another). */
export async function anyRowWith(
  db: Executor,
  table: PgTable,
  column: PgColumn,
  value: string,
): Promise<boolean> {
  const rows = await db
    .select({ one: sql`1` })
    .from(table)
    .where(eq(column, value))
    .limit(1);
  return rows.length > 0;
}

/** The unique constraint a PostgreSQL error violated (drizzle wraps the driver's error), or null. */
export function violatedUniqueConstraint(error: unknown): string | null {
  let current: unknown = error;
  for (let depth = 0; depth < 5 && current; depth++) {
    if (typeof current === 'object' && current !== null) {
      const candidate = current as { code?: unknown; constraint_name?: unknown; cause?: unknown };
      if (candidate.code === '23505') {
        return typeof candidate.constraint_name === 'string' ? candidate.constraint_name : '';
      }
      current = candidate.cause;
    } else {
      return null;
    }
  }
  return null;
}
