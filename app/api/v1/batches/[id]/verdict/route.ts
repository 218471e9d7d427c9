import { V1_ENDPOINTS } from '@/lib/contracts/api-v1-endpoints';
import { getBatchVerdict } from '@/server/api-v1/read';
import { apiV1Route } from '@/server/http/api-v1';

export const GET = apiV1Route(V1_ENDPOINTS.getBatchVerdict, async ({ caller, params }) => ({
  verdict: await getBatchVerdict(caller.organizationId, params.id),
}));
