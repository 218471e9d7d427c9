import type { ValueWithUncertainty } from '@/lib/surface-energy';
import type {
  Description,
  IndividualsChart,
  OneWayAnovaResult,
  TukeyFencesResult,
  VerdictOutcome,
  WelchTTestResult,
  WettingClassResult,
} from '@/lib/stats';

// What a comparison is made of: the rows db/queries/comparison loads (lib/contracts/compare.ts).
import type {
  ComparisonBatchInput,
  ComparisonDropInput,
  ComparisonDynamicInput,
  ComparisonLiquidInput,
  ComparisonSpecInput,
} from '@/lib/contracts/compare';

export type {
  ComparisonBatchInput,
  ComparisonDropInput,
  ComparisonDynamicInput,
  ComparisonLiquidInput,
  ComparisonSpecInput,
};

export interface ComparisonInput {
  batches: readonly ComparisonBatchInput[];
  liquids: readonly ComparisonLiquidInput[];
  specs: readonly ComparisonSpecInput[];
  drops: readonly ComparisonDropInput[];
  /** Dynamic measurements (series): advancing, receding, hysteresis and roll-off per batch. */
  dynamic?: readonly ComparisonDynamicInput[];
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

/** A batch's OWRK surface free energy, from the drops that count for the shown limit. */
export interface SurfaceEnergyValue {
  /** Null when it could not be computed (see `note`). */
  total: ValueWithUncertainty | null;
  dispersive: ValueWithUncertainty | null;
  polar: ValueWithUncertainty | null;
  /** The probe liquids used, with their drop count and mean angle. */
  liquids: { id: string; name: string; n: number; meanDeg: number }[];
  /** Drops of split liquids left out by the age window. */
  excluded: number;
  /** Why there is no value (null when there is one). */
  note: string | null;
}

export interface BatchSurfaceEnergy extends SurfaceEnergyValue {
  batch: ComparisonBatchInput;
  verdict: BatchVerdict;
}

export interface SurfaceEnergyComparison {
  method: string;
  /** How the value and its uncertainty are obtained, in words. */
  basis: string;
  /** ± figures are this many standard uncertainties. */
  coverageFactor: number;
  /** The coating's specs with a surface-energy limit. */
  specs: ComparisonSpecInput[];
  /** e.g. "≥ 38 mN/m, ≤ 7 d", one per spec. */
  limitLabels: string[];
  /** Age window of the values shown (that of the first limit), days; null = every drop. */
  windowDays: number | null;
  batches: BatchSurfaceEnergy[];
}

export interface Comparison {
  /** In production order, oldest first. */
  batches: ComparisonBatchInput[];
  referenceBatch: ComparisonBatchInput | null;
  liquids: LiquidComparison[];
  /**
   * Dynamic wetting per probe liquid and quantity (advancing, receding, hysteresis, roll-off),
   * with the same statistics and verdicts as the static angles; only those measured or limited.
   */
  dynamic: DynamicQuantityComparison[];
  /** Surface free energy per batch; null when there is neither a limit nor a value. */
  surfaceEnergy: SurfaceEnergyComparison | null;
  /** Which angle the statistics use, in words. */
  angleBasis: string;
  outlierRule: string;
}

export type DynamicQuantity = 'advancing' | 'receding' | 'hysteresis' | 'rollOff';

/** One dynamic quantity of one probe liquid compared across batches; each "drop" is a series. */
export interface DynamicQuantityComparison extends LiquidComparison {
  quantity: DynamicQuantity;
  /** e.g. "Water, advancing angle". */
  title: string;
}
