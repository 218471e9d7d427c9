import { waterCheckSchema } from '@/lib/contracts/tensiometry';
import { tensiometryRoutes } from '@/server/http/tensiometry-routes';
import { checkWater } from '@/server/tensiometry/water-check';

/**
 * Probe-liquid check: a measured water surface tension against IAPWS R1-76(2014) at the
 * measured temperature. POST body: { measuredMilliNewtonPerM, temperatureC,
 * toleranceMilliNewtonPerM? (1.0), save? } → { result: { referenceMilliNewtonPerM,
 * deviationMilliNewtonPerM, flag, message, … }, saved? }. GET: the saved checks (query: limit).
 */
export const { POST, GET } = tensiometryRoutes({
  body: waterCheckSchema,
  kinds: ['water-check'],
  compute: checkWater,
});
