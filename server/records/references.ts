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
