import { recordCollectionRoutes } from '@/server/http/record-routes';
import { specRecords } from '@/server/records/kinds';

/** The spec list (GET, with the filters of lib/contracts/specs.ts) and create (POST). */
export const { GET, POST } = recordCollectionRoutes(specRecords);
