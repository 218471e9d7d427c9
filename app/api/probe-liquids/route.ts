import { recordCollectionRoutes } from '@/server/http/record-routes';
import { probeLiquidRecords } from '@/server/records/kinds';

/** The probe liquid list (GET, with the filters of lib/contracts/probe-liquids.ts) and create (POST). */
export const { GET, POST } = recordCollectionRoutes(probeLiquidRecords);
