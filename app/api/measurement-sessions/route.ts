import { recordCollectionRoutes } from '@/server/http/record-routes';
import { measurementSessionRecords } from '@/server/records/kinds';

/** The measurement session list (GET, with the filters of lib/contracts/measurement-sessions.ts) and create (POST). */
export const { GET, POST } = recordCollectionRoutes(measurementSessionRecords);
