export { SurfaceEnergyInputError } from './errors';
export type { AngleMeasurement, LiquidComponents, SolidComponents } from './types';
export { PROBE_LIQUIDS, type ProbeLiquid, type ValueSource } from './liquids';
export { owrk, predictAngleOwrk, type OwrkResult, type OwrkPoint } from './owrk';
export { wu, type WuResult } from './wu';
export { fowkes, type FowkesResult } from './fowkes';
export { zisman, type ZismanResult } from './zisman';
export { neumann, neumannCosTheta, NEUMANN_BETA, type NeumannResult } from './neumann';
export { acidBase, type AcidBaseResult } from './acid-base';
export { wettingEnvelope, type WettingEnvelope } from './envelope';
export {
  propagateAngleUncertainty,
  surfaceEnergyWithUncertainty,
  SURFACE_ENERGY_METHODS,
  type SurfaceEnergyMethod,
  type MethodComponent,
  type ValueWithUncertainty,
  type UncertaintyResult,
  type PropagationOptions,
  type Propagation,
} from './uncertainty';
