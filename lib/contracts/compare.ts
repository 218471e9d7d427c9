import type { DynamicLimitValues } from './specs';
/*
 * What a comparison is made of: the rows db/queries/comparison.ts loads and lib/compare judges.
 * The compare page, its CSV export, the dashboard, the alerts and the certificate share them.
 */

/** A batch as the comparison sees it; `producedOn` is an ISO date (YYYY-MM-DD). */
export interface ComparisonBatchInput {
  id: string;
  lotCode: string;
  producedOn: string;
}

export interface ComparisonLiquidInput {
  id: string;
  name: string;
  /** Surface-tension components, mN/m; the surface-energy verdict needs the split ones. */
  gammaTotal?: number | null;
  gammaDispersive?: number | null;
  gammaPolar?: number | null;
}

/** Acceptance limits of the coating for one probe liquid (a row of `specs`); dynamic-wetting limits (°) are judged over each batch's series. */
export interface ComparisonSpecInput extends DynamicLimitValues {
  id: string;
  probeLiquidId: string;
  minDeg: number | null;
  maxDeg: number | null;
  scope: 'each-drop' | 'mean';
  maxDaysSinceTreatment: number | null;
  /** Surface free energy limits, mN/m (judged by OWRK over the batch). */
  minSurfaceEnergyMnM?: number | null;
  maxSurfaceEnergyMnM?: number | null;
  note: string;
}

/** Where and when a compared result was measured. Times are ISO strings. */
export interface ComparisonPlace {
  batchId: string;
  sampleId: string;
  sampleLabel: string;
  probeLiquidId: string;
  measuredAt: string;
  treatedAt: string | null;
}

/** One dynamic measurement (series) with the values of its latest analysis revision. */
export interface ComparisonDynamicInput extends ComparisonPlace {
  measurementId: string;
  advancingDeg: number | null;
  recedingDeg: number | null;
  hysteresisDeg: number | null;
  rollOffDeg: number | null;
}

/** One drop with the angles of its latest analysis revision. Times are ISO strings. */
export interface ComparisonDropInput extends ComparisonPlace {
  dropId: string;
  leftDeg: number;
  rightDeg: number;
  meanDeg: number;
}
