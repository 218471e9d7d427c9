import 'server-only';
import { archiveRecord, deleteRecord, findRecord } from '@/db/queries/records';
import { inTransaction } from '@/db/queries/transaction';
import { notFound } from '@/lib/app-error';
import type { ArchiveOrDeleteQuery } from '@/lib/contracts/common';
import type { Actor } from '../actor';
import { auditChange } from './audit';
import { staleVersion } from './errors';
import type { AnyRecordKind, RecordOf, RowOf } from './kind';

export type DeleteOutcome<T> = { outcome: 'archived' | 'deleted'; record: T };

/**
 * DELETE of a record: archived when results depend on it (or `mode=archive`), deleted when
 * nothing does; refused when `version` is given and the record moved on. With its audit row.
 */
export async function archiveOrDeleteRecord<K extends AnyRecordKind>(
  kind: K,
  actor: Actor,
  id: string,
  options: ArchiveOrDeleteQuery,
): Promise<DeleteOutcome<RecordOf<K>>> {
  const present = (row: RowOf<K>) => kind.present(row) as RecordOf<K>;
  return inTransaction(async (tx) => {
    const before = await findRecord<RowOf<K>>(
      tx,
      kind.table,
      kind.scope(actor.organizationId),
      id,
      { lock: true },
    );
    if (!before) throw notFound(`That ${kind.what}`);
    const readOnly = kind.readOnly?.(before);
    if (readOnly) throw readOnly;
    if (options.version !== undefined && before.version !== options.version) {
      throw staleVersion(kind.what, present(before));
    }
    if (options.mode === 'archive' || (await kind.hasDependents(tx, id))) {
      if (before.archivedAt) return { outcome: 'archived', record: present(before) };
      const row = await archiveRecord<RowOf<K>>(tx, kind.table, id);
      await auditChange(tx, kind.entity, actor, 'archive', id, before, row);
      return { outcome: 'archived', record: present(row) };
    }
    await deleteRecord(tx, kind.table, id);
    await auditChange(tx, kind.entity, actor, 'delete', id, before, null);
    return { outcome: 'deleted', record: present(before) };
  });
}
