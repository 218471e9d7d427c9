import { apiV1Route } from '@/server/http/api-v1';
import { createRecord } from '@/server/records/create';
import { V1_ENDPOINTS } from '@/lib/contracts/api-v1-endpoints';
import { v1RecordListRoute } from '@/server/http/api-v1-records';
import { measurementSessionRecords } from '@/server/records/kinds';

export const GET = v1RecordListRoute(measurementSessionRecords, V1_ENDPOINTS.listSessions);

export const POST = apiV1Route(V1_ENDPOINTS.createSession, async ({ caller, body }) => ({
  measurementSession: await createRecord(measurementSessionRecords, caller, body),
}));
