import 'server-only';
import type { Page } from '@/lib/contracts/common';
import type { AnyRecordKind, ListItemOf, QueryOf } from './kind';

/** One page of a kind of record, with the list's filters and sort. */
export async function listRecords<K extends AnyRecordKind>(
  kind: K,
  organizationId: string,
  query: QueryOf<K>,
): Promise<Page<ListItemOf<K>>> {
  return kind.list(organizationId, query) as Promise<Page<ListItemOf<K>>>;
}
