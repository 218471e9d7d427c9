import 'server-only';
import { listBatches } from '@/db/queries/batches';
import { listCoatings } from '@/db/queries/coatings';
import { listMeasurementSessions } from '@/db/queries/measurement-sessions';
import { listProbeLiquidRows, type ProbeLiquidRow } from '@/db/queries/probe-liquids';
import { anyRowWith, ownedBy, probeLiquidVisibleTo } from '@/db/queries/records';
import { listSamplesWithResults } from '@/db/queries/sample-results';
import { listSamples } from '@/db/queries/samples';
import { listSpecs } from '@/db/queries/specs';
import {
  batches,
  coatings,
  drops,
  measurementSessions,
  probeLiquids,
  samples,
  specs,
} from '@/db/schema';
import { AppError } from '@/lib/app-error';
import {
  batchCreateSchema,
  batchListQuerySchema,
  batchUpdateSchema,
  type Batch,
} from '@/lib/contracts/batches';
import {
  coatingCreateSchema,
  coatingListQuerySchema,
  coatingUpdateSchema,
  type Coating,
} from '@/lib/contracts/coatings';
import {
  measurementSessionCreateSchema,
  measurementSessionListQuerySchema,
  measurementSessionUpdateSchema,
  type MeasurementSession,
} from '@/lib/contracts/measurement-sessions';
import {
  checkProbeLiquidComponents,
  probeLiquidCreateSchema,
  probeLiquidListQuerySchema,
  probeLiquidUpdateSchema,
  type ProbeLiquid,
} from '@/lib/contracts/probe-liquids';
import {
  sampleCreateSchema,
  sampleListQuerySchema,
  sampleUpdateSchema,
  type Sample,
} from '@/lib/contracts/samples';
import {
  checkSpecLimits,
  specCreateSchema,
  specListQuerySchema,
  specUpdateSchema,
  type Spec,
} from '@/lib/contracts/specs';
import {
  batchColumns,
  coatingColumns,
  measurementSessionColumns,
  probeLiquidColumns,
  sampleColumns,
  specColumns,
} from '@/lib/csv/columns';
import { duplicate } from './errors';
import { csvExport, defineRecordKind, withoutUndefined } from './kind';

/*
 * The six kinds of lab record. Everything they share (list, get, create, update with optimistic
 * concurrency, archive-or-delete, audit, routes, CSV export) is written once in server/records
 * and server/http/record-routes.ts; here is only what differs.
 */

const same = <T>(row: T): T => row;

/** Compile-time check: the table's rows are what the contract says the record is. */
type RowIs<Row extends Contract, Contract> = Row;
type _Rows = [
  RowIs<typeof coatings.$inferSelect, Coating>,
  RowIs<typeof specs.$inferSelect, Spec>,
  RowIs<typeof batches.$inferSelect, Batch>,
  RowIs<typeof samples.$inferSelect, Sample>,
  RowIs<ProbeLiquidRow, Omit<ProbeLiquid, 'builtIn'>>,
  RowIs<typeof measurementSessions.$inferSelect, MeasurementSession>,
];
/** ISO text → Date; null clears; undefined leaves the column as it is. */
const toDate = (value: string | null | undefined) =>
  value === undefined ? undefined : value === null ? null : new Date(value);

export const coatingRecords = defineRecordKind({
  entity: 'coating',
  what: 'coating',
  plural: 'coatings',
  key: 'coating',
  writeAction: 'catalog:manage',
  table: coatings,
  scope: (organizationId) => ownedBy(coatings, organizationId),
  schemas: {
    create: coatingCreateSchema,
    update: coatingUpdateSchema,
    list: coatingListQuerySchema,
  },
  list: listCoatings,
  exportCsv: csvExport({ fileStem: 'coatings', columns: () => coatingColumns, list: listCoatings }),
  present: same<Coating>,
  toInsert: (actor, input) => ({
    organizationId: actor.organizationId,
    code: input.code,
    name: input.name,
    description: input.description ?? '',
    createdByUserId: actor.userId,
  }),
  toUpdate: (changes) => changes,
  hasDependents: async (tx, id) =>
    (await anyRowWith(tx, batches, batches.coatingId, id)) ||
    (await anyRowWith(tx, specs, specs.coatingId, id)),
  unique: {
    coatings_org_code_unique: () =>
      duplicate(
        'code',
        'Another coating in this organization already has this code. Use a different code.',
      ),
  },
});

export const specRecords = defineRecordKind({
  entity: 'spec',
  what: 'spec',
  plural: 'specs',
  key: 'spec',
  writeAction: 'catalog:manage',
  table: specs,
  scope: (organizationId) => ownedBy(specs, organizationId),
  schemas: { create: specCreateSchema, update: specUpdateSchema, list: specListQuerySchema },
  list: listSpecs,
  exportCsv: csvExport({ fileStem: 'specs', columns: () => specColumns, list: listSpecs }),
  present: same<Spec>,
  // Limits not given are null; the database's defaults fill the rest.
  toInsert: (actor, input) => ({
    ...withoutUndefined(input),
    organizationId: actor.organizationId,
  }),
  toUpdate: (changes) => changes,
  references: { coatingId: 'coating', probeLiquidId: 'probeLiquid' },
  checkMerged: (spec) => checkSpecLimits(spec),
  // Nothing refers to a spec, so DELETE removes it unless ?mode=archive asks to keep it.
  hasDependents: async () => false,
});

export const batchRecords = defineRecordKind({
  entity: 'batch',
  what: 'batch',
  plural: 'batches',
  key: 'batch',
  writeAction: 'records:write',
  table: batches,
  scope: (organizationId) => ownedBy(batches, organizationId),
  schemas: { create: batchCreateSchema, update: batchUpdateSchema, list: batchListQuerySchema },
  list: listBatches,
  exportCsv: csvExport({ fileStem: 'batches', columns: () => batchColumns, list: listBatches }),
  present: same<Batch>,
  toInsert: (actor, input) => ({
    organizationId: actor.organizationId,
    coatingId: input.coatingId,
    lotCode: input.lotCode,
    producedOn: input.producedOn,
    process: input.process ?? {},
    notes: input.notes ?? '',
    createdByUserId: actor.userId,
  }),
  // `process`, when sent, replaces the stored parameters as a whole.
  toUpdate: (changes) => changes,
  references: { coatingId: 'coating' },
  hasDependents: (tx, id) => anyRowWith(tx, samples, samples.batchId, id),
  unique: {
    batches_org_lot_unique: () =>
      duplicate(
        'lotCode',
        'Another batch in this organization already has this lot code. Use a different lot code.',
      ),
  },
});

export const sampleRecords = defineRecordKind({
  entity: 'sample',
  what: 'sample',
  plural: 'samples',
  key: 'sample',
  writeAction: 'records:write',
  table: samples,
  scope: (organizationId) => ownedBy(samples, organizationId),
  schemas: { create: sampleCreateSchema, update: sampleUpdateSchema, list: sampleListQuerySchema },
  list: listSamples,
  // The export adds each sample's drop counts and mean water angle.
  exportCsv: csvExport({
    fileStem: 'samples',
    columns: () => sampleColumns(),
    // Exports need results:export, which viewers do not have: every latest result.
    list: (organizationId, query) => listSamplesWithResults(organizationId, query, 'all'),
  }),
  present: same<Sample>,
  toInsert: (actor, input) => ({
    organizationId: actor.organizationId,
    batchId: input.batchId,
    label: input.label,
    substrate: input.substrate ?? '',
    position: input.position ?? '',
    treatedAt: toDate(input.treatedAt) ?? null,
    notes: input.notes ?? '',
    createdByUserId: actor.userId,
  }),
  toUpdate: ({ treatedAt, ...changes }) => ({ ...changes, treatedAt: toDate(treatedAt) }),
  references: { batchId: 'batch' },
  hasDependents: (tx, id) => anyRowWith(tx, drops, drops.sampleId, id),
  unique: {
    samples_batch_label_unique: () =>
      duplicate(
        'label',
        'Another sample of this batch already has this label. Use a different label.',
      ),
  },
});

/** A probe liquid as the API returns it; `builtIn` marks the read-only library entries. */
const withOrigin = (row: ProbeLiquidRow): ProbeLiquid => ({
  ...row,
  builtIn: row.organizationId === null,
});

async function listProbeLiquids(
  organizationId: string,
  query: Parameters<typeof listProbeLiquidRows>[1],
) {
  const page = await listProbeLiquidRows(organizationId, query);
  return { ...page, items: page.items.map(withOrigin) };
}

export const probeLiquidRecords = defineRecordKind({
  entity: 'probe_liquid',
  what: 'probe liquid',
  plural: 'probe liquids',
  key: 'probeLiquid',
  writeAction: 'catalog:manage',
  table: probeLiquids,
  scope: probeLiquidVisibleTo,
  schemas: {
    create: probeLiquidCreateSchema,
    update: probeLiquidUpdateSchema,
    list: probeLiquidListQuerySchema,
  },
  list: listProbeLiquids,
  exportCsv: csvExport({
    fileStem: 'probe-liquids',
    columns: () => probeLiquidColumns,
    list: listProbeLiquids,
  }),
  present: withOrigin,
  // Components not given are null; the database's defaults fill the rest.
  toInsert: (actor, input) => ({
    ...withoutUndefined(input),
    organizationId: actor.organizationId,
  }),
  toUpdate: (changes) => changes,
  checkMerged: (liquid) => checkProbeLiquidComponents(liquid),
  hasDependents: async (tx, id) =>
    (await anyRowWith(tx, specs, specs.probeLiquidId, id)) ||
    (await anyRowWith(tx, drops, drops.probeLiquidId, id)) ||
    (await anyRowWith(tx, measurementSessions, measurementSessions.probeLiquidId, id)),
  readOnly: (row: ProbeLiquidRow) =>
    row.organizationId === null
      ? new AppError(
          'read_only',
          'Built-in probe liquids are shared by every organization and cannot be changed. Add your own probe liquid with the values you need.',
        )
      : null,
});

export const measurementSessionRecords = defineRecordKind({
  entity: 'measurement_session',
  what: 'measurement session',
  plural: 'measurement sessions',
  key: 'measurementSession',
  writeAction: 'records:write',
  table: measurementSessions,
  scope: (organizationId) => ownedBy(measurementSessions, organizationId),
  schemas: {
    create: measurementSessionCreateSchema,
    update: measurementSessionUpdateSchema,
    list: measurementSessionListQuerySchema,
  },
  list: listMeasurementSessions,
  exportCsv: csvExport({
    fileStem: 'measurement-sessions',
    columns: () => measurementSessionColumns,
    list: listMeasurementSessions,
  }),
  present: same<MeasurementSession>,
  toInsert: (actor, input) => ({
    organizationId: actor.organizationId,
    operatorName: input.operatorName,
    measuredAt: new Date(input.measuredAt),
    probeLiquidId: input.probeLiquidId ?? null,
    temperatureC: input.temperatureC,
    humidityPct: input.humidityPct,
    dropVolumeUl: input.dropVolumeUl,
    scalePxPerMm: input.scalePxPerMm,
    instrumentNotes: input.instrumentNotes ?? '',
    liquidLot: input.liquidLot ?? '',
    createdByUserId: actor.userId,
  }),
  toUpdate: ({ measuredAt, ...changes }) => ({
    ...changes,
    measuredAt: measuredAt === undefined ? undefined : new Date(measuredAt),
  }),
  references: { probeLiquidId: 'probeLiquid' },
  hasDependents: (tx, id) => anyRowWith(tx, drops, drops.sessionId, id),
});

/** Every kind, for code that treats them alike (tests, the role matrix). */
export const RECORD_KINDS = [
  coatingRecords,
  specRecords,
  batchRecords,
  sampleRecords,
  probeLiquidRecords,
  measurementSessionRecords,
] as const;
