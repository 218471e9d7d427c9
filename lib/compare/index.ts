export {
  ANGLE_BASIS,
  OUTLIER_RULE,
  SURFACE_ENERGY_LABEL,
  WATER_LIQUID_ID,
  ageInDays,
  batchesOutOfSpec,
  countsInWindow,
  buildComparison,
  formatP,
  productionOrder,
  verdictOutcomes,
  welchSentence,
} from './build';
export { dropsCsv, CSV_HEADER } from './csv';
export type * from './types';
export { compareQuerySchema, compareSearch, parseCompareQuery, type CompareQuery } from './query';
export { compareSurfaceEnergy, surfaceEnergyLimitLabel, COVERAGE_FACTOR } from './surface-energy';
export { overall } from './outcome';
