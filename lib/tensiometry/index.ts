export { TensiometryInputError } from './errors';
export {
  waterSurfaceTension,
  checkWaterProbe,
  IAPWS_R1_76,
  type ProbeLiquidCheck,
  type ProbeLiquidCheckFlag,
} from './water';
export {
  wilhelmySurfaceTension,
  wilhelmyContactAngle,
  wilhelmyForceMilliNewton,
  wettedPerimeterMm,
  buoyancyMilliNewton,
  STANDARD_GRAVITY,
  type WilhelmyPlate,
  type WilhelmyReading,
  type WilhelmyTerms,
  type WilhelmySurfaceTensionResult,
  type WilhelmyContactAngleResult,
} from './wilhelmy';
