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

/** Acceptance limits of the coating for one probe liquid (a row of `specs`). */
export interface ComparisonSpecInput {
  id: string;
  probeLiquidId: string;
  minDeg: number | null;
  maxDeg: number | null;
  scope: 'each-drop' | 'mean';
  maxDaysSinceTreatment: number | null;
  /** Surface free energy limits, mN/m (judged by OWRK over the batch). */
  minSurfaceEnergyMnM?: number | null;
  maxSurfaceEnergyMnM?: number | null;
  /** Dynamic-wetting limits (°), judged over each batch's dynamic measurements. */
  minAdvancingDeg?: number | null;
  maxAdvancingDeg?: number | null;
  minRecedingDeg?: number | null;
  maxRecedingDeg?: number | null;
  minHysteresisDeg?: number | null;
  maxHysteresisDeg?: number | null;
  minRollOffDeg?: number | null;
  maxRollOffDeg?: number | null;
  note: string;
}

/** One dynamic measurement (series) with the values of its latest analysis revision. */
export interface ComparisonDynamicInput {
  measurementId: string;
  batchId: string;
  sampleId: string;
  sampleLabel: string;
  probeLiquidId: string;
  measuredAt: string;
  treatedAt: string | null;
  advancingDeg: number | null;
  recedingDeg: number | null;
  hysteresisDeg: number | null;
  rollOffDeg: number | null;
}

/** One drop with the angles of its latest analysis revision. Times are ISO strings. */
export interface ComparisonDropInput {
  dropId: string;
  batchId: string;
  sampleId: string;
  sampleLabel: string;
  probeLiquidId: string;
  measuredAt: string;
  treatedAt: string | null;
  leftDeg: number;
  rightDeg: number;
  meanDeg: number;
}
