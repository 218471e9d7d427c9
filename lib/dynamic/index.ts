/**
 * Dynamic wetting from a series of frames of one drop: tracking, contact-line phases, advancing
 * and receding angles and hysteresis, the tilting plate and angle over time. Pure TypeScript on
 * top of lib/analysis; runs in a worker, in Node and in tests. Video decoding (Node only) is in
 * ./node/ffmpeg.ts.
 */
export * from './types';
export {
  analyseSeries,
  frameTimes,
  type AnalyseSeriesOptions,
  type SeriesProgress,
} from './series';
export { SeriesTracker, baselineStillFits, regionAround } from './track';
export {
  detectPhases,
  summariseDynamic,
  windowStats,
  frameWarnings,
  type DynamicSummary,
  type PhaseDetection,
  type PhaseKind,
  type PhaseOptions,
  type PhaseSegment,
  type SummaryOptions,
} from './phases';
export {
  analyseTiltingPlate,
  tiltsFromRate,
  type AngleAtTilt,
  type DropSide,
  type TiltFrame,
  type TiltOptions,
  type TiltResult,
} from './tilt';
export { tiltsFromCsv, TiltCsvError, type TiltCsvOptions } from './tilt-csv';
export {
  analyseAngleOverTime,
  type AngleOverTime,
  type AngleOverTimeOptions,
  type AngleOverTimePoint,
  type InitialAngle,
  type RateOverWindow,
} from './angle-over-time';
export { seriesReport, type SeriesReport, type ContractFrame, type ContractStats } from './report';
export { fitLine, fitPolynomial, noiseFromSecondDifferences } from './regression';
export { segmentLines, type LineSegment, type SegmentOptions } from './segments';
export {
  DYNAMIC_KINDS,
  isFlagged,
  keptFrames,
  summariseMeasurement,
  type DynamicKind,
  type KeptSeriesFrame,
  type MeasurementOptions,
  type MeasurementResult,
  type RollOff,
} from './measurement';
