import { recordCollectionRoutes } from '@/server/http/record-routes';
import { sampleRecords } from '@/server/records/kinds';

/** The sample list (GET, with the filters of lib/contracts/samples.ts) and create (POST). */
export const { GET, POST } = recordCollectionRoutes(sampleRecords);
