import { describe, expect, it } from 'vitest';
import { batchesOutOfSpec, buildComparison } from '@/lib/compare';
import type { ComparisonDynamicInput, ComparisonSpecInput } from '@/lib/compare';

const WATER = { id: 'liquid-water', name: 'Water' };
const batches = [
  { id: 'B1', lotCode: 'B1', producedOn: '2026-11-01' },
  { id: 'B2', lotCode: 'B2', producedOn: '2026-11-02' },
];

let seq = 0;
function series(
  batchId: string,
  values: { advancingDeg: number | null; recedingDeg: number | null; rollOffDeg?: number }[],
): ComparisonDynamicInput[] {
  return values.map((v) => ({
    measurementId: `m${++seq}`,
    batchId,
    sampleId: `${batchId}-s`,
    sampleLabel: 'P1',
    probeLiquidId: WATER.id,
    measuredAt: '2026-11-03T08:00:00.000Z',
    treatedAt: null,
    advancingDeg: v.advancingDeg,
    recedingDeg: v.recedingDeg,
    hysteresisDeg:
      v.advancingDeg !== null && v.recedingDeg !== null ? v.advancingDeg - v.recedingDeg : null,
    rollOffDeg: v.rollOffDeg ?? null,
  }));
}

const spec: ComparisonSpecInput = {
  id: 'spec-dyn',
  probeLiquidId: WATER.id,
  minDeg: null,
  maxDeg: null,
  scope: 'each-drop',
  maxDaysSinceTreatment: null,
  minAdvancingDeg: 105,
  maxHysteresisDeg: 20,
  note: '',
};

const dynamic = [
  ...series('B1', [
    { advancingDeg: 108, recedingDeg: 92 },
    { advancingDeg: 109, recedingDeg: 93 },
    { advancingDeg: 110, recedingDeg: 91 },
  ]),
  ...series('B2', [
    { advancingDeg: 104, recedingDeg: 80 },
    { advancingDeg: 106, recedingDeg: 82 },
    { advancingDeg: 105, recedingDeg: 81 },
  ]),
];

describe('dynamic wetting in the batch comparison', () => {
  const comparison = buildComparison({
    batches,
    liquids: [WATER],
    specs: [spec],
    drops: [],
    dynamic,
  });
  const quantity = (q: string) => comparison.dynamic.find((d) => d.quantity === q)!;

  it('compares advancing, receding and hysteresis with the static statistics; roll-off only when measured or limited', () => {
    expect(comparison.dynamic.map((d) => d.quantity)).toEqual([
      'advancing',
      'receding',
      'hysteresis',
    ]);
    expect(quantity('advancing').title).toBe('Water, advancing angle');
    // Mean and sample SD of 108, 109, 110 by hand: 109 and 1.
    const b1 = quantity('advancing').batches[0];
    expect(b1.description?.n).toBe(3);
    expect(b1.description?.mean).toBeCloseTo(109, 12);
    expect(b1.description?.sd).toBeCloseTo(1, 12);
    // Hysteresis of B2: 24, 24, 24.
    expect(quantity('hysteresis').batches[1].description?.mean).toBeCloseTo(24, 12);
    expect(quantity('advancing').vsPrevious).toHaveLength(1);
    expect(quantity('advancing').vsPrevious[0].sentence).toContain('Welch t-test');
  });

  it('judges each quantity against its own limits, and a failing one puts the batch out of spec', () => {
    expect(quantity('advancing').batches.map((b) => b.verdict.outcome)).toEqual(['pass', 'fail']);
    expect(quantity('hysteresis').batches.map((b) => b.verdict.outcome)).toEqual(['pass', 'fail']);
    // Receding is not limited by the spec.
    expect(quantity('receding').batches.map((b) => b.verdict.outcome)).toEqual([
      'no-spec',
      'no-spec',
    ]);
    const out = batchesOutOfSpec(comparison);
    expect(out.map((o) => `${o.batch.lotCode}: ${o.liquidName}`)).toEqual([
      'B2: Water, advancing angle',
      'B2: Water, hysteresis',
    ]);
  });

  it('adds nothing when there is no series and no dynamic limit', () => {
    const plain = buildComparison({ batches, liquids: [WATER], specs: [], drops: [] });
    expect(plain.dynamic).toEqual([]);
  });
});
