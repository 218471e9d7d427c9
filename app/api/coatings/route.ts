import { recordCollectionRoutes } from '@/server/http/record-routes';
import { coatingRecords } from '@/server/records/kinds';

/** The coating list (GET, with the filters of lib/contracts/coatings.ts) and create (POST). */
export const { GET, POST } = recordCollectionRoutes(coatingRecords);
