import 'server-only';
import { newId } from '@/db/queries/ids';
import { insertRecord } from '@/db/queries/records';
import { inTransaction } from '@/db/queries/transaction';
import type { Actor } from '../actor';
import { auditChange } from './audit';
import { withUniqueChecks } from './errors';
import { checkReferences } from './references';
import type { AnyRecordKind, CreateOf, RecordOf, RowOf } from './kind';

/** Creates a record (its references checked) with its audit row, in one transaction. */
export async function createRecord<K extends AnyRecordKind>(
  kind: K,
  actor: Actor,
  input: CreateOf<K>,
): Promise<RecordOf<K>> {
  return withUniqueChecks(
    () =>
      inTransaction(async (tx) => {
        await checkReferences(
          tx,
          kind.references,
          actor.organizationId,
          input as Record<string, unknown>,
        );
        const row = await insertRecord<RowOf<K>>(tx, kind.table, {
          id: newId(),
          ...kind.toInsert(actor, input),
        });
        await auditChange(tx, kind.entity, actor, 'create', row.id, null, row);
        return kind.present(row) as RecordOf<K>;
      }),
    kind.unique,
  );
}
