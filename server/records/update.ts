import 'server-only';
import { findRecord, updateRecordAtVersion } from '@/db/queries/records';
import { inTransaction } from '@/db/queries/transaction';
import type { Actor } from '../actor';
import { auditChange } from './audit';
import { assertEditable, failedUpdate, withUniqueChecks } from './errors';
import {
  withoutUndefined,
  type AnyRecordKind,
  type RecordOf,
  type RowOf,
  type UpdateOf,
} from './kind';
import { checkReferences } from './references';

/**
 * Changes a record with optimistic concurrency: refused when it is archived or moved on from
 * `version` (409 with the current record), references and cross-field rules checked on the
 * record as it will be, with its audit row, in one transaction.
 */
export async function updateRecord<K extends AnyRecordKind>(
  kind: K,
  actor: Actor,
  id: string,
  input: UpdateOf<K>,
): Promise<RecordOf<K>> {
  const { version, ...changes } = input as UpdateOf<K> & { version: number };
  const present = (row: RowOf<K>) => kind.present(row);
  return withUniqueChecks(
    () =>
      inTransaction(async (tx) => {
        const scope = kind.scope(actor.organizationId);
        const before = await findRecord<RowOf<K>>(tx, kind.table, scope, id);
        const readOnly = before && kind.readOnly?.(before);
        if (readOnly) throw readOnly;
        assertEditable(kind.what, before, version, present);
        // Cross-field rules hold for the record as it will be, not only for the fields sent.
        kind.checkMerged?.({ ...before, ...withoutUndefined(changes) });
        await checkReferences(tx, kind.references, actor.organizationId, changes, before);
        const row = await updateRecordAtVersion<RowOf<K>>(
          tx,
          kind.table,
          { organizationId: actor.organizationId, id, version },
          kind.toUpdate(changes),
        );
        if (!row) {
          throw failedUpdate(
            kind.what,
            await findRecord<RowOf<K>>(tx, kind.table, scope, id),
            present,
          );
        }
        await auditChange(tx, kind.entity, actor, 'update', id, before, row);
        return present(row) as RecordOf<K>;
      }),
    kind.unique,
  );
}
