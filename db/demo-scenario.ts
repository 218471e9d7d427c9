/**
 * The invented demo scenario of the product brief: Kestrel Surface Works develops HT-200, a
 * fluorine-free hydrophobic topcoat for outdoor aluminium panels, and runs PP-Print, a
 * plasma-treated polypropylene film that must wet for printing. Every angle below is only the
 * angle a drop photo is *rendered* at; the numbers the product shows come from analysing those
 * photos with lib/analysis at seed time.
 */
import type { ProcessParameters } from './schema';

export type DemoDrop = {
  liquid: 'water' | 'diiodomethane';
  renderDeg: number;
  bond: number;
  seed: number;
};
export type DemoSample = {
  label: string;
  substrate: string;
  position: string;
  ageDays: number | null;
  drops: DemoDrop[];
};
export type DemoBatch = {
  lotCode: string;
  producedOn: string;
  process: ProcessParameters;
  notes: string;
  samples: DemoSample[];
};
export type DemoCoating = {
  code: string;
  name: string;
  description: string;
  specs: {
    liquid: 'water' | 'diiodomethane';
    minDeg?: number;
    maxDeg?: number;
    scope: 'each-drop' | 'mean';
    minSurfaceEnergyMnM?: number;
    maxDaysSinceTreatment?: number;
    note: string;
  }[];
  batches: DemoBatch[];
};

/** Small deterministic scatter so drops of a sample differ like real repeats. */
function scatter(seed: number, spread: number): number {
  const x = Math.sin(seed * 12.9898) * 43758.5453;
  return (x - Math.floor(x) - 0.5) * 2 * spread;
}

const isoDate = (start: string, days: number) => {
  const d = new Date(`${start}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
};

// HT-200: eight weekly batches; the cure temperature drifts down and the angle with it.
const htMeans = [110.5, 111.2, 109.8, 110.9, 108.7, 106.4, 104.1, 101.6];
const htBatches: DemoBatch[] = htMeans.map((mean, b) => ({
  lotCode: `B-${String(405 + b).padStart(4, '0')}`,
  producedOn: isoDate('2026-09-28', 7 * b),
  process: {
    cureTemperatureC: 182 - (b >= 5 ? (b - 4) * 4 : 0),
    cureTimeMin: 20,
    lineSpeedMPerMin: 6,
    coatWeightGPerM2: 38,
  },
  notes: b >= 6 ? 'Oven zone 2 thermocouple under investigation.' : '',
  samples: ['P1', 'P2'].map((label, s) => ({
    label,
    substrate: 'Aluminium 5754, chromate-free pretreatment',
    position: s === 0 ? 'coil start' : 'coil end',
    ageDays: null,
    drops: [0, 1, 2].map((d) => {
      const seed = 1000 + b * 100 + s * 10 + d;
      return { liquid: 'water' as const, renderDeg: mean + scatter(seed, 1.6), bond: 0.25, seed };
    }),
  })),
}));

// PP-Print: three treatment runs, each measured 1, 4 and 8 days after treatment; the film slowly
// loses its treatment (hydrophobic recovery), so the water angle rises with age.
const ppRuns = [
  { lotCode: 'F-2611', producedOn: '2026-11-02', dose: 16, base: 57 },
  { lotCode: 'F-2612', producedOn: '2026-11-09', dose: 14, base: 60 },
  { lotCode: 'F-2613', producedOn: '2026-11-16', dose: 11, base: 64 },
];
const ppBatches: DemoBatch[] = ppRuns.map((run, r) => ({
  lotCode: run.lotCode,
  producedOn: run.producedOn,
  process: { plasmaDoseWMinPerM2: run.dose, lineSpeedMPerMin: 120 },
  notes: '',
  samples: [1, 4, 8].map((ageDays, a) => ({
    label: `D${ageDays}`,
    substrate: 'BOPP film, 30 µm',
    position: 'web centre',
    ageDays,
    drops: [
      ...[0, 1, 2].map((d) => {
        const seed = 5000 + r * 100 + a * 10 + d;
        return {
          liquid: 'water' as const,
          renderDeg: run.base + 1.3 * ageDays + scatter(seed, 1.4),
          bond: 0.25,
          seed,
        };
      }),
      ...[0, 1].map((d) => {
        const seed = 6000 + r * 100 + a * 10 + d;
        return {
          liquid: 'diiodomethane' as const,
          renderDeg: 38 + 0.7 * ageDays + (run.base - 57) * 0.5 + scatter(seed, 1.2),
          bond: 0.35,
          seed,
        };
      }),
    ],
  })),
}));

export const DEMO_COATINGS: DemoCoating[] = [
  {
    code: 'HT-200',
    name: 'Fluorine-free hydrophobic topcoat',
    description: 'Topcoat for outdoor aluminium panels. Must bead water.',
    specs: [
      { liquid: 'water', minDeg: 100, scope: 'each-drop', note: 'Every drop at least 100°.' },
      { liquid: 'water', minDeg: 105, scope: 'mean', note: 'Mean of the batch at least 105°.' },
    ],
    batches: htBatches,
  },
  {
    code: 'PP-Print',
    name: 'Plasma-treated polypropylene film',
    description:
      'Film treated for printing: must wet well enough to print within 7 days of treatment.',
    specs: [
      {
        liquid: 'water',
        maxDeg: 70,
        scope: 'each-drop',
        maxDaysSinceTreatment: 7,
        minSurfaceEnergyMnM: 38,
        note: 'Water at most 70° per drop within 7 days of treatment; surface free energy at least 38 mN/m.',
      },
    ],
    batches: ppBatches,
  },
];

export const DEMO_LIQUID_IDS = {
  water: 'liquid-water',
  diiodomethane: 'liquid-diiodomethane',
} as const;
