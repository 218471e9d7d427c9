import 'server-only';
import type { Batch, BatchListItem } from '@/lib/contracts/batches';
import type { Coating } from '@/lib/contracts/coatings';
import type { SampleWithResults } from '@/lib/contracts/samples';
import type { MeasurementSessionListItem } from '@/lib/contracts/measurement-sessions';
import type { ProbeLiquid } from '@/lib/contracts/probe-liquids';
import type { SpecListItem } from '@/lib/contracts/specs';
import { PROCESS_PARAMETERS, type ProcessParameterKey } from '@/lib/contracts/batches';
import type { CsvColumn } from './index';

/*
 * The columns of each exported table: headers name the unit, times are ISO 8601 UTC, numbers are
 * written in full precision (the page rounds for display, the file does not).
 */

const DAY_MS = 86_400_000;

export const coatingColumns: CsvColumn<Coating>[] = [
  { header: 'Code', value: (c) => c.code },
  { header: 'Name', value: (c) => c.name },
  { header: 'Description', value: (c) => c.description },
  { header: 'Created at (UTC)', value: (c) => c.createdAt },
  { header: 'Updated at (UTC)', value: (c) => c.updatedAt },
  { header: 'Archived at (UTC)', value: (c) => c.archivedAt },
  { header: 'Id', value: (c) => c.id },
];

export const specColumns: CsvColumn<SpecListItem>[] = [
  { header: 'Coating code', value: (s) => s.coatingCode },
  { header: 'Probe liquid', value: (s) => s.probeLiquidName },
  { header: 'Applies to', value: (s) => (s.scope === 'mean' ? 'mean' : 'each drop') },
  { header: 'Min contact angle (°)', value: (s) => s.minDeg },
  { header: 'Max contact angle (°)', value: (s) => s.maxDeg },
  { header: 'Min surface energy (mN/m)', value: (s) => s.minSurfaceEnergyMnM },
  { header: 'Max surface energy (mN/m)', value: (s) => s.maxSurfaceEnergyMnM },
  { header: 'Max time since treatment (days)', value: (s) => s.maxDaysSinceTreatment },
  { header: 'Note', value: (s) => s.note },
  { header: 'Archived at (UTC)', value: (s) => s.archivedAt },
  { header: 'Id', value: (s) => s.id },
];

const processColumns = (Object.keys(PROCESS_PARAMETERS) as ProcessParameterKey[]).map(
  (key): CsvColumn<Batch> => ({
    header: `${PROCESS_PARAMETERS[key].label} (${PROCESS_PARAMETERS[key].unit})`,
    value: (b) => b.process[key],
  }),
);

export const batchColumns: CsvColumn<BatchListItem>[] = [
  { header: 'Lot code', value: (b) => b.lotCode },
  { header: 'Coating code', value: (b) => b.coatingCode },
  { header: 'Coating name', value: (b) => b.coatingName },
  { header: 'Produced on', value: (b) => b.producedOn },
  ...(processColumns as CsvColumn<BatchListItem>[]),
  { header: 'Notes', value: (b) => b.notes },
  { header: 'Archived at (UTC)', value: (b) => b.archivedAt },
  { header: 'Id', value: (b) => b.id },
];

export const sampleColumns = (now = new Date()): CsvColumn<SampleWithResults>[] => [
  { header: 'Sample label', value: (s) => s.label },
  { header: 'Batch lot code', value: (s) => s.batchLotCode },
  { header: 'Substrate', value: (s) => s.substrate },
  { header: 'Position', value: (s) => s.position },
  { header: 'Treated at (UTC)', value: (s) => s.treatedAt },
  {
    header: 'Time since treatment (days)',
    value: (s) =>
      s.treatedAt
        ? Math.round(((now.getTime() - s.treatedAt.getTime()) / DAY_MS) * 100) / 100
        : null,
  },
  { header: 'Drops', value: (s) => s.dropCount },
  { header: 'Water drops', value: (s) => s.waterDropCount },
  { header: 'Mean water contact angle (°)', value: (s) => s.meanWaterDeg },
  { header: 'Notes', value: (s) => s.notes },
  { header: 'Id', value: (s) => s.id },
];

export const probeLiquidColumns: CsvColumn<ProbeLiquid>[] = [
  { header: 'Name', value: (l) => l.name },
  { header: 'Origin', value: (l) => (l.builtIn ? 'built-in library' : 'own') },
  { header: 'Total surface tension (mN/m)', value: (l) => l.totalMnM },
  { header: 'Dispersive (mN/m)', value: (l) => l.dispersiveMnM },
  { header: 'Polar (mN/m)', value: (l) => l.polarMnM },
  { header: 'Lifshitz–van der Waals (mN/m)', value: (l) => l.lifshitzVanDerWaalsMnM },
  { header: 'Acid γ+ (mN/m)', value: (l) => l.acidMnM },
  { header: 'Base γ− (mN/m)', value: (l) => l.baseMnM },
  { header: 'Density (g/cm³)', value: (l) => l.densityGPerCm3 },
  {
    header: 'Sources',
    value: (l) =>
      Object.entries(l.sources)
        .map(([key, source]) => `${key}: ${source}`)
        .join('; '),
  },
  { header: 'Hazard note', value: (l) => l.hazardNote },
  { header: 'Id', value: (l) => l.id },
];

export const measurementSessionColumns: CsvColumn<MeasurementSessionListItem>[] = [
  { header: 'Measured at (UTC)', value: (s) => s.measuredAt },
  { header: 'Operator', value: (s) => s.operatorName },
  { header: 'Probe liquid', value: (s) => s.probeLiquidName },
  { header: 'Temperature (°C)', value: (s) => s.temperatureC },
  { header: 'Relative humidity (%)', value: (s) => s.humidityPct },
  { header: 'Drop volume (µL)', value: (s) => s.dropVolumeUl },
  { header: 'Scale (px/mm)', value: (s) => s.scalePxPerMm },
  { header: 'Instrument notes', value: (s) => s.instrumentNotes },
  { header: 'Liquid lot', value: (s) => s.liquidLot },
  { header: 'Id', value: (s) => s.id },
];
