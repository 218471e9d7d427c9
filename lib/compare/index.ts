export {
  ANGLE_BASIS,
  OUTLIER_RULE,
  WATER_LIQUID_ID,
  ageInDays,
  batchesOutOfSpec,
  buildComparison,
  formatP,
  productionOrder,
  welchSentence,
} from './build';
export { dropsCsv, CSV_HEADER } from './csv';
export type * from './types';
export { compareQuerySchema, compareSearch, parseCompareQuery, type CompareQuery } from './query';
