import 'server-only';
import { and, eq, ilike, isNull, or, type SQL } from 'drizzle-orm';
import type { PgColumn } from 'drizzle-orm/pg-core';
import { HttpError, notFound } from '@/lib/api/errors';
import type { Database } from '../client';
import { batches, coatings, probeLiquids } from '../schema';
import { recordAudit } from './audit';

/*
 * Shared pieces of the lab-record queries (coatings, specs, batches, samples, probe liquids,
 * measurement sessions): pagination, text search, optimistic-concurrency and conflict errors,
 * and the organization checks on referenced records.
 */

export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
export type Executor = Database | Transaction;

/** One page of a list; `page` is 1-based, `total` counts every matching record. */
export type Page<T> = { items: T[]; total: number; page: number; pageSize: number };

/** Who makes a change, in which organization (for the organization scope and the audit row). */
export type Actor = { organizationId: string; userId: string };

export type DeleteOutcome<T> = { outcome: 'archived' | 'deleted'; record: T };

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

/** The fields an update body actually sets (undefined = left as it is). */
export function withoutUndefined<T extends object>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as Partial<T>;
}

export const offsetOf = (query: { page: number; pageSize: number }) =>
  (query.page - 1) * query.pageSize;

// ---------------------------------------------------------------------------------------------
// Errors
// ---------------------------------------------------------------------------------------------

/** 409: the record changed since the editor loaded it; the body carries `current`. */
export function staleVersion(what: string, current: unknown): HttpError {
  return new HttpError(
    409,
    'stale_version',
    `Someone changed this ${what} after you opened it. Review the current values and make your change again.`,
    undefined,
    { current },
  );
}

export function archivedRecord(what: string): HttpError {
  return new HttpError(
    409,
    'archived',
    `This ${what} is archived and can no longer be changed. Ask an admin if it should come back.`,
  );
}

export function duplicate(field: string, message: string): HttpError {
  return new HttpError(409, 'duplicate', message, { [field]: message });
}

/** 404 naming the body field that points at a record this organization does not have. */
export function referenceNotFound(field: string, what: string): HttpError {
  const message = `${what} was not found in this organization. Choose one of your organization’s records.`;
  return new HttpError(404, 'not_found', message, { [field]: message });
}

function referenceArchived(field: string, what: string): HttpError {
  const message = `${what} is archived. Choose a current one.`;
  return new HttpError(409, 'archived', message, { [field]: message });
}

/** The unique constraint a PostgreSQL error violated (drizzle wraps the driver's error). */
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

/** Runs `work`, turning a unique violation of a known constraint into a 409 duplicate. */
export async function withDuplicateCheck<T>(
  work: () => Promise<T>,
  constraints: Record<string, () => HttpError>,
): Promise<T> {
  try {
    return await work();
  } catch (error) {
    const constraint = violatedUniqueConstraint(error);
    const toError = constraint === null ? undefined : constraints[constraint];
    if (toError) throw toError();
    throw error;
  }
}

/**
 * After an UPDATE … WHERE version = $v touched no row: 404 when the record is gone, 409 archived
 * when it was archived meanwhile, else 409 stale_version with the current record.
 */
export function failedUpdate<T extends { archivedAt: Date | null; version: number }>(
  what: string,
  current: T | undefined,
): HttpError {
  if (!current) return notFound(`That ${what}`);
  if (current.archivedAt) return archivedRecord(what);
  return staleVersion(what, current);
}

/** Checks before an update: the record exists here, is not archived, and is at `version`. */
export function assertEditable<T extends { archivedAt: Date | null; version: number }>(
  what: string,
  current: T | undefined,
  version: number,
): asserts current is T {
  if (!current) throw notFound(`That ${what}`);
  if (current.archivedAt) throw archivedRecord(what);
  if (current.version !== version) throw staleVersion(what, current);
}

/** DELETE with `?version=`: refuse when the record moved on. */
export function assertVersionIfGiven<T extends { version: number }>(
  what: string,
  current: T,
  version: number | undefined,
): void {
  if (version !== undefined && current.version !== version) throw staleVersion(what, current);
}

// ---------------------------------------------------------------------------------------------
// Referenced records must belong to the organization (or, for probe liquids, the library)
// ---------------------------------------------------------------------------------------------

export async function requireCoatingReference(
  db: Executor,
  organizationId: string,
  coatingId: string,
  field = 'coatingId',
): Promise<void> {
  const [row] = await db
    .select({ archivedAt: coatings.archivedAt })
    .from(coatings)
    .where(and(eq(coatings.id, coatingId), eq(coatings.organizationId, organizationId)));
  if (!row) throw referenceNotFound(field, 'That coating');
  if (row.archivedAt) throw referenceArchived(field, 'That coating');
}

export async function requireBatchReference(
  db: Executor,
  organizationId: string,
  batchId: string,
  field = 'batchId',
): Promise<void> {
  const [row] = await db
    .select({ archivedAt: batches.archivedAt })
    .from(batches)
    .where(and(eq(batches.id, batchId), eq(batches.organizationId, organizationId)));
  if (!row) throw referenceNotFound(field, 'That batch');
  if (row.archivedAt) throw referenceArchived(field, 'That batch');
}

/** A probe liquid from the built-in library or the organization's own. */
export function probeLiquidVisibleTo(organizationId: string): SQL {
  return or(
    isNull(probeLiquids.organizationId),
    eq(probeLiquids.organizationId, organizationId),
  ) as SQL;
}

export async function requireProbeLiquidReference(
  db: Executor,
  organizationId: string,
  probeLiquidId: string,
  field = 'probeLiquidId',
): Promise<void> {
  const [row] = await db
    .select({ archivedAt: probeLiquids.archivedAt })
    .from(probeLiquids)
    .where(and(eq(probeLiquids.id, probeLiquidId), probeLiquidVisibleTo(organizationId)));
  if (!row) throw referenceNotFound(field, 'That probe liquid');
  if (row.archivedAt) throw referenceArchived(field, 'That probe liquid');
}

// ---------------------------------------------------------------------------------------------
// Audit
// ---------------------------------------------------------------------------------------------

export type ChangeVerb = 'create' | 'update' | 'archive' | 'delete';

/** The audit row of one change to a lab record (`coating.update`, …), in the same transaction. */
export async function auditChange(
  tx: Transaction,
  entityType: string,
  actor: Actor,
  verb: ChangeVerb,
  entityId: string,
  before: unknown,
  after: unknown,
): Promise<void> {
  await recordAudit(tx, {
    actorUserId: actor.userId,
    organizationId: actor.organizationId,
    action: `${entityType}.${verb}`,
    entityType,
    entityId,
    before,
    after,
  });
}
