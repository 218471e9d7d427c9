export { StatsInputError } from './errors';
export {
  studentTQuantile,
  studentTCritical,
  studentTTwoSidedP,
  fUpperTailP,
} from './distributions';
export {
  describe,
  confidenceInterval,
  mean,
  median,
  quantile,
  sampleSd,
  sampleVariance,
  sumOfSquaredDeviations,
  type ConfidenceInterval,
  type Description,
} from './describe';
export { welchTTest, type WelchTTestResult } from './welch';
export { oneWayAnova, type OneWayAnovaResult } from './anova';
export {
  individualsChart,
  IMR_CONSTANTS,
  type IndividualsChart,
  type ControlChartPoint,
} from './control-chart';
export { capability, type CapabilityResult, type SpecLimits, type SigmaMethod } from './capability';
export {
  tukeyFences,
  grubbsTest,
  grubbsCriticalValue,
  type TukeyFencesResult,
  type GrubbsResult,
  type GrubbsStep,
} from './outliers';
export { judgeAngles, type AngleSpec, type Verdict, type VerdictOutcome } from './verdict';
export { classifyWetting, type WettingClass, type WettingClassResult } from './wetting-class';
