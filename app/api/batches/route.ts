import { recordCollectionRoutes } from '@/server/http/record-routes';
import { batchRecords } from '@/server/records/kinds';

/** The batch list (GET, with the filters of lib/contracts/batches.ts) and create (POST). */
export const { GET, POST } = recordCollectionRoutes(batchRecords);
