import 'server-only';
import type { V1Endpoint } from '@/lib/contracts/api-v1-endpoints';
import { listRecordsPage } from '../api-v1/read';
import { getRecord } from '../records/get';
import type { AnyRecordKind } from '../records/kind';
import { apiV1Route } from './api-v1';

/** `/api/v1/<records>`: a page of a kind of lab record, with the web list's filters and sort. */
export function v1RecordListRoute(kind: AnyRecordKind, endpoint: V1Endpoint) {
  return apiV1Route(endpoint, async ({ caller, query }) =>
    listRecordsPage(kind, caller.organizationId, query as Record<string, unknown>),
  );
}

/** `/api/v1/<records>/{id}`: one record, under its key (`{ sample }`). */
export function v1RecordItemRoute(kind: AnyRecordKind, endpoint: V1Endpoint) {
  return apiV1Route(endpoint, async ({ caller, params }) => ({
    [kind.key]: await getRecord(kind, caller.organizationId, (params as { id: string }).id),
  }));
}
