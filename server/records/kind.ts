import 'server-only';
import type { SQL } from 'drizzle-orm';
import type { z } from 'zod';
import type { Transaction } from '@/db/queries/transaction';
import type { ReferenceKind } from './references';
import type { RecordTable } from '@/db/queries/records';
import type { AppError } from '@/lib/app-error';
import type { Action } from '@/lib/auth/permissions';
import { MAX_PAGE_SIZE, type ListQuery, type Page } from '@/lib/contracts/common';
import { csvFileName, csvResponse, pagedRows, type CsvColumn } from '@/lib/csv';
import type { Actor } from '../actor';

type Versioned = { id: string; archivedAt: Date | null; version: number };

/**
 * One kind of lab record (coating, spec, batch, sample, probe liquid, measurement session): its
 * table, contracts and the few rules that differ between kinds. The records service
 * (list/get/create/update/archive-or-delete) and the route factories (server/http/record-routes)
 * are the same for every kind.
 */
export type RecordKind<
  Row extends Versioned,
  Out,
  Item,
  Create extends z.ZodType,
  Update extends z.ZodType,
  Query extends z.ZodType,
> = {
  /** Audit entity type: `coating`, `measurement_session`, … */
  entity: string;
  /** In messages: "That measurement session was not found …". */
  what: string;
  /** "Your role … does not allow you to add measurement sessions." */
  plural: string;
  /** The key of one record in replies: `{ measurementSession }`. */
  key: string;
  /** Who may create, change and archive (everyone may read). */
  writeAction: Action;
  table: RecordTable;
  /** The rows an organization may read (its own; probe liquids also the library). */
  scope(organizationId: string): SQL;
  schemas: { create: Create; update: Update; list: Query };
  list(organizationId: string, query: z.output<Query>): Promise<Page<Item>>;
  /** The CSV export of the list (see csvExport). */
  exportCsv(organizationId: string, query: z.output<Query>): Promise<Response>;
  /** The row as the API answers it. */
  present(row: Row): Out;
  /** Columns of a new row (organization, creator and defaults included). */
  toInsert(actor: Actor, input: z.output<Create>): Record<string, unknown>;
  /** Columns an update sets (its version already taken off). */
  toUpdate(changes: Omit<z.output<Update>, 'version'>): Record<string, unknown>;
  /**
   * Fields that name another record, and its kind: on create, and when an update changes them,
   * the record must be this organization's (or the library's) and current.
   */
  references?: Record<string, ReferenceKind>;
  /** Cross-field rules on the record as it will be after an update (the body alone may not tell). */
  checkMerged?(merged: Row): void;
  /** Whether results depend on the record (then DELETE archives it). */
  hasDependents(tx: Transaction, id: string): Promise<boolean>;
  /** Unique constraints and the duplicate error each means. */
  unique?: Record<string, () => AppError>;
  /** A record nobody may change (the built-in probe liquids), with why. */
  readOnly?(row: Row): AppError | null;
};

// The service and route factories take any kind; their generics are checked where each kind is
// defined (defineRecordKind), so here the parameters are left open.
export type AnyRecordKind = RecordKind<
  Versioned,
  unknown,
  unknown,
  z.ZodType,
  z.ZodType,
  z.ZodType<ListQuery>
>;

/** Checks a kind's parts against each other and infers its types. */
export function defineRecordKind<
  Row extends Versioned,
  Out,
  Item,
  Create extends z.ZodType,
  Update extends z.ZodType,
  Query extends z.ZodType<ListQuery>,
>(kind: RecordKind<Row, Out, Item, Create, Update, Query>) {
  return kind;
}

/**
 * A list's CSV export: every row matching the list's filters and sort (all pages), streamed
 * page by page as UTF-8 CSV with `columns`.
 */
export function csvExport<Row, Query extends ListQuery>(config: {
  fileStem: string;
  columns: () => CsvColumn<Row>[];
  list: (organizationId: string, query: Query) => Promise<Page<Row>>;
}) {
  return (organizationId: string, query: Query): Promise<Response> =>
    csvResponse({
      fileName: csvFileName(config.fileStem),
      columns: config.columns(),
      fetchPage: pagedRows(
        (page, pageSize) => config.list(organizationId, { ...query, page, pageSize }),
        MAX_PAGE_SIZE,
      ),
    });
}

/** `{ a: undefined, b: 1 }` → `{ b: 1 }`: the fields an update body actually sets. */
export function withoutUndefined<T extends object>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as Partial<T>;
}

type Parts<K> =
  K extends RecordKind<infer Row, infer Out, infer Item, infer C, infer U, infer Q>
    ? { row: Row; out: Out; item: Item; create: C; update: U; query: Q }
    : never;

export type RowOf<K> = Parts<K>['row'];
export type RecordOf<K> = Parts<K>['out'];
export type ListItemOf<K> = Parts<K>['item'];
export type CreateOf<K> = z.output<Parts<K>['create']>;
export type UpdateOf<K> = z.output<Parts<K>['update']>;
export type QueryOf<K> = z.output<Parts<K>['query']>;
