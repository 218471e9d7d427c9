import 'server-only';
import { findRecord, ownedBy, probeLiquidVisibleTo, type RecordTable } from '@/db/queries/records';
import type { Executor } from '@/db/queries/transaction';
import { batches, coatings, probeLiquids } from '@/db/schema';
import { referenceNotFound } from '@/lib/app-error';
import { referenceArchived } from './errors';

const REFERENCES = {
  coating: { table: coatings, what: 'That coating', field: 'coatingId' },
  batch: { table: batches, what: 'That batch', field: 'batchId' },
  probeLiquid: { table: probeLiquids, what: 'That probe liquid', field: 'probeLiquidId' },
} satisfies Record<string, { table: RecordTable; what: string; field: string }>;

export type ReferenceKind = keyof typeof REFERENCES;

/**
 * A record named in a body must be the organization's (for probe liquids: its own or the
 * library's) and not archived; else not_found / archived naming the body field.
 */
export async function requireReference(
  db: Executor,
  which: keyof typeof REFERENCES,
  organizationId: string,
  id: string,
): Promise<void> {
  const { table, what, field } = REFERENCES[which];
  const scope =
    which === 'probeLiquid' ? probeLiquidVisibleTo(organizationId) : ownedBy(table, organizationId);
  const row = await findRecord<{ archivedAt: Date | null }>(db, table, scope, id);
  if (!row) throw referenceNotFound(field, what);
  if (row.archivedAt) throw referenceArchived(field, what);
}

/**
 * Checks every reference `values` names (on update: only those that differ from `before`); an
 * empty or null reference is no reference.
 */
export async function checkReferences(
  db: Executor,
  references: Record<string, ReferenceKind> | undefined,
  organizationId: string,
  values: Record<string, unknown>,
  before?: Record<string, unknown>,
): Promise<void> {
  for (const [field, which] of Object.entries(references ?? {})) {
    const id = values[field];
    if (typeof id !== 'string' || id === '' || (before && id === before[field])) continue;
    await requireReference(db, which, organizationId, id);
  }
}
