import { apiV1Route } from '@/server/http/api-v1';
import { createRecord } from '@/server/records/create';
import { V1_ENDPOINTS } from '@/lib/contracts/api-v1-endpoints';
import { v1RecordListRoute } from '@/server/http/api-v1-records';
import { sampleRecords } from '@/server/records/kinds';

export const GET = v1RecordListRoute(sampleRecords, V1_ENDPOINTS.listSamples);

export const POST = apiV1Route(V1_ENDPOINTS.createSample, async ({ caller, body }) => ({
  sample: await createRecord(sampleRecords, caller, body),
}));
