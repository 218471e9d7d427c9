import type {
  Description,
  IndividualsChart,
  OneWayAnovaResult,
  TukeyFencesResult,
  VerdictOutcome,
  WelchTTestResult,
  WettingClassResult,
} from '@/lib/stats';

/** A batch as the comparison sees it; `producedOn` is an ISO date (YYYY-MM-DD). */
export interface ComparisonBatchInput {
  id: string;
  lotCode: string;
  producedOn: string;
}

export interface ComparisonLiquidInput {
  id: string;
  name: string;
}

/** Acceptance limits of the coating for one probe liquid (a row of `specs`). */
export interface ComparisonSpecInput {
  id: string;
  probeLiquidId: string;
  minDeg: number | null;
  maxDeg: number | null;
  scope: 'each-drop' | 'mean';
  maxDaysSinceTreatment: number | null;
  note: string;
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

export interface ComparisonInput {
  batches: readonly ComparisonBatchInput[];
  liquids: readonly ComparisonLiquidInput[];
  specs: readonly ComparisonSpecInput[];
  drops: readonly ComparisonDropInput[];
  /** The batch every other batch is also tested against (the "last good one"). */
  referenceBatchId?: string | null;
  /** Fewest drops a verdict needs (judgeAngles' default is 3). */
  minDrops?: number;
  /** Probe liquid whose angle gives the hydrophobicity class (water). */
  waterLiquidId?: string;
}

export interface DropPoint extends ComparisonDropInput {
  /** Days between the sample's treatment and the measurement; null without a treatment time. */
  ageDays: number | null;
  /** Flagged by Tukey's fences within its batch (k = 1.5); flagged, never removed. */
  outlier: boolean;
  /** Outside the age window of a spec of its liquid, so that spec does not count it. */
  outsideAgeWindow: boolean;
}

export interface SpecVerdict {
  specId: string;
  outcome: VerdictOutcome;
  /** The rule applied, in words, including any age window. */
  rule: string;
  reason: string;
  /** Drops that counted for this spec. */
  n: number;
  /** Drops of the batch left out by the age window. */
  excluded: number;
}

export interface BatchVerdict {
  /** 'no-spec' when the coating has no angle spec for the liquid. */
  outcome: VerdictOutcome | 'no-spec';
  specs: SpecVerdict[];
}

export interface CapabilitySummary {
  cpk: number;
  rule: string;
  sigmaMethod: string;
  n: number;
}

export interface BatchLiquidResult {
  batch: ComparisonBatchInput;
  drops: DropPoint[];
  /** Over the mean angle of every drop; null when the batch has no drop of this liquid. */
  description: Description | null;
  /** Water only; from the batch mean. */
  wettingClass: WettingClassResult | null;
  verdict: BatchVerdict;
  capability: CapabilitySummary | null;
  /** Why there is no capability index, in words (null when there is one). */
  capabilityNote: string | null;
  outliers: Pick<TukeyFencesResult, 'rule' | 'k' | 'lowerFence' | 'upperFence'> | null;
}

export interface BatchTest {
  batchId: string;
  otherBatchId: string;
  /** e.g. "B-0412 is 2.5° lower than B-0411 (Welch t-test, p = 0.012)". */
  sentence: string;
  result: WelchTTestResult | null;
}

export interface TrendPoint {
  batchId: string;
  lotCode: string;
  producedOn: string;
  mean: number;
  outsideLimits: boolean;
}

export interface TrendChart {
  method: IndividualsChart['method'];
  centreLine: number;
  ucl: number;
  lcl: number;
  points: TrendPoint[];
}

export interface SpecLine {
  specId: string;
  value: number;
  kind: 'min' | 'max';
  scope: 'each-drop' | 'mean';
  label: string;
}

export interface LiquidComparison {
  liquid: ComparisonLiquidInput;
  specs: ComparisonSpecInput[];
  specLines: SpecLine[];
  batches: BatchLiquidResult[];
  vsPrevious: BatchTest[];
  vsReference: BatchTest[];
  anova: { result: OneWayAnovaResult | null; sentence: string };
  trend: TrendChart | null;
  /** Why there is no trend chart (null when there is one). */
  trendNote: string | null;
}

export interface Comparison {
  /** In production order, oldest first. */
  batches: ComparisonBatchInput[];
  referenceBatch: ComparisonBatchInput | null;
  liquids: LiquidComparison[];
  /** Which angle the statistics use, in words. */
  angleBasis: string;
  outlierRule: string;
}
