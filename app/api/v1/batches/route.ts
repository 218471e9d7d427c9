import { V1_ENDPOINTS } from '@/lib/contracts/api-v1-endpoints';
import { v1RecordListRoute } from '@/server/http/api-v1-records';
import { batchRecords } from '@/server/records/kinds';

export const GET = v1RecordListRoute(batchRecords, V1_ENDPOINTS.listBatches);
