import { ageInDays } from './build';
import type {
  ComparisonDynamicInput,
  ComparisonInput,
  ComparisonLiquidInput,
  ComparisonSpecInput,
  DropPoint,
  DynamicQuantity,
  DynamicQuantityComparison,
  LiquidComparison,
} from './types';

/** Each dynamic quantity: its value on a measurement, its spec limits and its name. */
const QUANTITIES: {
  quantity: DynamicQuantity;
  label: string;
  value: (m: ComparisonDynamicInput) => number | null;
  limits: (s: ComparisonSpecInput) => { min: number | null; max: number | null };
}[] = [
  {
    quantity: 'advancing',
    label: 'advancing angle',
    value: (m) => m.advancingDeg,
    limits: (s) => ({ min: s.minAdvancingDeg ?? null, max: s.maxAdvancingDeg ?? null }),
  },
  {
    quantity: 'receding',
    label: 'receding angle',
    value: (m) => m.recedingDeg,
    limits: (s) => ({ min: s.minRecedingDeg ?? null, max: s.maxRecedingDeg ?? null }),
  },
  {
    quantity: 'hysteresis',
    label: 'hysteresis',
    value: (m) => m.hysteresisDeg,
    limits: (s) => ({ min: s.minHysteresisDeg ?? null, max: s.maxHysteresisDeg ?? null }),
  },
  {
    quantity: 'rollOff',
    label: 'roll-off angle',
    value: (m) => m.rollOffDeg,
    limits: (s) => ({ min: s.minRollOffDeg ?? null, max: s.maxRollOffDeg ?? null }),
  },
];

/**
 * Dynamic wetting compared like the static angles: for every probe liquid and quantity that was
 * measured or is limited by a spec, each measurement counts as one value (as a drop's mean angle
 * does) and `compare` gives the same description, verdicts, outliers, tests and trend. A spec's
 * dynamic limits take the place of its angle limits, with its scope and age window.
 */
export function compareDynamic(
  input: ComparisonInput,
  batchIds: ReadonlySet<string>,
  compare: (
    liquid: ComparisonLiquidInput,
    specs: ComparisonSpecInput[],
    dropsOf: (batchId: string) => DropPoint[],
  ) => LiquidComparison,
): DynamicQuantityComparison[] {
  const measurements = (input.dynamic ?? []).filter((m) => batchIds.has(m.batchId));
  const out: DynamicQuantityComparison[] = [];
  for (const liquid of input.liquids) {
    for (const q of QUANTITIES) {
      const points = measurements
        .filter((m) => m.probeLiquidId === liquid.id && q.value(m) !== null)
        .map((m) => {
          const value = q.value(m) as number;
          return {
            m,
            point: {
              dropId: m.measurementId,
              batchId: m.batchId,
              sampleId: m.sampleId,
              sampleLabel: m.sampleLabel,
              probeLiquidId: m.probeLiquidId,
              measuredAt: m.measuredAt,
              treatedAt: m.treatedAt,
              leftDeg: value,
              rightDeg: value,
              meanDeg: value,
              ageDays: ageInDays(m.measuredAt, m.treatedAt),
              outlier: false,
              outsideAgeWindow: false,
            } satisfies DropPoint,
          };
        });
      const specs = input.specs
        .filter((s) => s.probeLiquidId === liquid.id)
        .map((s) => ({ spec: s, ...q.limits(s) }))
        .filter((l) => l.min !== null || l.max !== null)
        .map((l) => ({ ...l.spec, minDeg: l.min, maxDeg: l.max }));
      if (points.length === 0 && specs.length === 0) continue;
      const byBatch = (batchId: string) =>
        points.filter((p) => p.m.batchId === batchId).map((p) => p.point);
      out.push({
        ...compare(liquid, specs, byBatch),
        quantity: q.quantity,
        title: `${liquid.name}, ${q.label}`,
      });
    }
  }
  return out;
}
