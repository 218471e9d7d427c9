import 'server-only';
import { findRecord } from '@/db/queries/records';
import { database } from '@/db/queries/transaction';
import { notFound } from '@/lib/app-error';
import type { AnyRecordKind, RecordOf, RowOf } from './kind';

/** One record the organization may read, or null. */
export async function findRecordOf<K extends AnyRecordKind>(
  kind: K,
  organizationId: string,
  id: string,
): Promise<RecordOf<K> | null> {
  const row = await findRecord<RowOf<K>>(database(), kind.table, kind.scope(organizationId), id);
  return row ? (kind.present(row) as RecordOf<K>) : null;
}

/** One record the organization may read; not_found otherwise. */
export async function getRecord<K extends AnyRecordKind>(
  kind: K,
  organizationId: string,
  id: string,
): Promise<RecordOf<K>> {
  const record = await findRecordOf(kind, organizationId, id);
  if (!record) throw notFound(`That ${kind.what}`);
  return record;
}
