import 'server-only';
import { and, asc, desc, eq, inArray, isNull, or, sql } from 'drizzle-orm';
import type {
  ComparisonBatchInput,
  ComparisonDropInput,
  ComparisonDynamicInput,
  ComparisonLiquidInput,
  ComparisonSpecInput,
} from '@/lib/contracts/compare';
import { getDb } from '../client';
import { batches, coatings, probeLiquids, specs } from '../schema';
import { andVisibleStatus, type ResultVisibility } from './visibility';

/** A spec's dynamic-wetting limits, selected wherever a spec is judged or written out. */
export const dynamicLimitColumns = {
  minAdvancingDeg: specs.minAdvancingDeg,
  maxAdvancingDeg: specs.maxAdvancingDeg,
  minRecedingDeg: specs.minRecedingDeg,
  maxRecedingDeg: specs.maxRecedingDeg,
  minHysteresisDeg: specs.minHysteresisDeg,
  maxHysteresisDeg: specs.maxHysteresisDeg,
  minRollOffDeg: specs.minRollOffDeg,
  maxRollOffDeg: specs.maxRollOffDeg,
};

/** Batches compared when none are chosen: the coating's newest ones. */
export const DEFAULT_BATCH_COUNT = 12;

export interface ComparisonCoating {
  id: string;
  code: string;
  name: string;
}

/** A drop of the comparison with what the CSV export also needs. */
export interface ComparisonDropRow extends ComparisonDropInput {
  lotCode: string;
  producedOn: string;
  analysisId: string;
  revision: number;
  reviewStatus: 'draft' | 'submitted' | 'approved' | 'rejected';
}

export interface ComparisonData {
  coating: ComparisonCoating;
  /** Every live batch of the coating, newest first (for the picker). */
  allBatches: ComparisonBatchInput[];
  /** The batches compared, newest first. */
  batches: ComparisonBatchInput[];
  specs: ComparisonSpecInput[];
  liquids: ComparisonLiquidInput[];
  drops: ComparisonDropRow[];
  dynamic: ComparisonDynamicInput[];
}

/** Live coatings of the organization, by code. */
export async function listComparisonCoatings(organizationId: string): Promise<ComparisonCoating[]> {
  return getDb()
    .select({ id: coatings.id, code: coatings.code, name: coatings.name })
    .from(coatings)
    .where(and(eq(coatings.organizationId, organizationId), isNull(coatings.archivedAt)))
    .orderBy(asc(coatings.code));
}

/** A coating of the organization by id or by code; null when there is none. */
export async function findComparisonCoating(
  organizationId: string,
  idOrCode: string,
): Promise<ComparisonCoating | null> {
  const [row] = await getDb()
    .select({ id: coatings.id, code: coatings.code, name: coatings.name })
    .from(coatings)
    .where(
      and(
        eq(coatings.organizationId, organizationId),
        isNull(coatings.archivedAt),
        or(eq(coatings.id, idOrCode), eq(coatings.code, idOrCode)),
      ),
    )
    .limit(1);
  return row ?? null;
}

type DropSqlRow = {
  drop_id: string;
  analysis_id: string;
  revision: number;
  review_status: ComparisonDropRow['reviewStatus'];
  batch_id: string;
  lot_code: string;
  produced_on: string;
  sample_id: string;
  sample_label: string;
  treated_at: Date | string | null;
  measured_at: Date | string;
  probe_liquid_id: string;
  left_deg: number;
  right_deg: number;
  mean_deg: number;
};

const iso = (v: Date | string) => (v instanceof Date ? v : new Date(v)).toISOString();

/** The columns every compared result carries: where it was measured and when. */
type SampleSqlRow = {
  batch_id: string;
  sample_id: string;
  sample_label: string;
  probe_liquid_id: string;
  measured_at: Date | string;
  treated_at: Date | string | null;
};

function sampleFields(r: SampleSqlRow) {
  return {
    batchId: r.batch_id,
    sampleId: r.sample_id,
    sampleLabel: r.sample_label,
    probeLiquidId: r.probe_liquid_id,
    measuredAt: iso(r.measured_at),
    treatedAt: r.treated_at === null ? null : iso(r.treated_at),
  };
}

/** Where a kind of result is stored and its analysis revisions are. */
type ResultTables =
  | { results: 'drops'; analyses: 'analyses'; owner: 'drop_id' }
  | { results: 'dynamic_measurements'; analyses: 'dynamic_analyses'; owner: 'measurement_id' };

/**
 * From the live batches `b` (of the organization, among `batchIds`) and their live samples `s`:
 * every live result `r` (a drop or a dynamic measurement) with `columns` of its latest analysis
 * revision as `a` (a lateral subquery that walks the (owner, revision) unique index backwards),
 * as `visibility` allows (db/queries/visibility.ts); in batch, sample and measurement order.
 */
function latestResultsOfBatches(
  organizationId: string,
  batchIds: readonly string[],
  visibility: ResultVisibility,
  tables: ResultTables,
  columns: string,
) {
  const ids = sql.join(
    batchIds.map((id) => sql`${id}`),
    sql`, `,
  );
  return sql`from batches b
    join samples s on s.batch_id = b.id and s.organization_id = b.organization_id
                  and s.archived_at is null
    join ${sql.raw(tables.results)} r on r.sample_id = s.id
                and r.organization_id = b.organization_id and r.archived_at is null
    join lateral (
      select ${sql.raw(columns)}, x.review_status
      from ${sql.raw(tables.analyses)} x
      where x.${sql.raw(tables.owner)} = r.id
      order by x.revision desc
      limit 1
    ) a on true
    where b.organization_id = ${organizationId}
      and b.id in (${ids})
      and b.archived_at is null
      ${andVisibleStatus(visibility, sql`a.review_status`)}
    order by b.produced_on, b.lot_code, s.label, r.measured_at, r.id`;
}

/**
 * Every live drop of the given batches with its latest analysis (highest revision), as
 * `visibility` allows (db/queries/visibility.ts). One query; the lateral subquery
 * walks analyses_drop_revision_unique (drop_id, revision) backwards, drops come through
 * drops_sample_idx and samples through samples_batch_label_unique.
 */
export async function comparisonDrops(
  organizationId: string,
  batchIds: readonly string[],
  options: { visibility: ResultVisibility },
): Promise<ComparisonDropRow[]> {
  if (batchIds.length === 0) return [];
  const rows = await getDb().execute<DropSqlRow>(sql`
    select r.id as drop_id, a.id as analysis_id, a.revision, a.review_status,
           b.id as batch_id, b.lot_code, b.produced_on::text as produced_on,
           s.id as sample_id, s.label as sample_label, s.treated_at,
           r.measured_at, r.probe_liquid_id, a.left_deg, a.right_deg, a.mean_deg
    ${latestResultsOfBatches(
      organizationId,
      batchIds,
      options.visibility,
      { results: 'drops', analyses: 'analyses', owner: 'drop_id' },
      'x.id, x.revision, x.left_deg, x.right_deg, x.mean_deg',
    )}
  `);
  return rows.map((r) => ({
    dropId: r.drop_id,
    analysisId: r.analysis_id,
    revision: Number(r.revision),
    reviewStatus: r.review_status,
    ...sampleFields(r),
    lotCode: r.lot_code,
    producedOn: r.produced_on,
    leftDeg: Number(r.left_deg),
    rightDeg: Number(r.right_deg),
    meanDeg: Number(r.mean_deg),
  }));
}

type DynamicSqlRow = SampleSqlRow & {
  measurement_id: string;
  advancing_deg: number | null;
  receding_deg: number | null;
  hysteresis_deg: number | null;
  roll_off_deg: number | null;
};

const numberOrNull = (v: number | string | null) => (v === null ? null : Number(v));

/**
 * Every live dynamic measurement of the given batches with the values of its latest analysis
 * revision, as `visibility` allows (the same rule as for drops).
 */
export async function comparisonDynamic(
  organizationId: string,
  batchIds: readonly string[],
  options: { visibility: ResultVisibility },
): Promise<ComparisonDynamicInput[]> {
  if (batchIds.length === 0) return [];
  const rows = await getDb().execute<DynamicSqlRow>(sql`
    select r.id as measurement_id, b.id as batch_id, s.id as sample_id, s.label as sample_label,
           r.probe_liquid_id, r.measured_at, s.treated_at,
           a.advancing_deg, a.receding_deg, a.hysteresis_deg, a.roll_off_deg
    ${latestResultsOfBatches(
      organizationId,
      batchIds,
      options.visibility,
      { results: 'dynamic_measurements', analyses: 'dynamic_analyses', owner: 'measurement_id' },
      'x.advancing_deg, x.receding_deg, x.hysteresis_deg, x.roll_off_deg',
    )}
  `);
  return rows.map((r) => ({
    measurementId: r.measurement_id,
    ...sampleFields(r),
    advancingDeg: numberOrNull(r.advancing_deg),
    recedingDeg: numberOrNull(r.receding_deg),
    hysteresisDeg: numberOrNull(r.hysteresis_deg),
    rollOffDeg: numberOrNull(r.roll_off_deg),
  }));
}

/**
 * What a comparison of one coating needs: its batches (the chosen ones, by id or lot code,
 * or else the newest twelve), its live specs, the probe liquids involved (with their surface
 * tension components, for the surface-energy verdict) and every drop's
 * latest analysis (approved ones only for roles that may not read every result).
 */
export async function loadComparison(
  organizationId: string,
  coatingId: string,
  options: { batches?: readonly string[]; visibility: ResultVisibility },
): Promise<Omit<ComparisonData, 'coating'>> {
  const db = getDb();
  const [allBatches, specRows] = await Promise.all([
    db
      .select({ id: batches.id, lotCode: batches.lotCode, producedOn: batches.producedOn })
      .from(batches)
      .where(
        and(
          eq(batches.organizationId, organizationId),
          eq(batches.coatingId, coatingId),
          isNull(batches.archivedAt),
        ),
      )
      .orderBy(desc(batches.producedOn), desc(batches.lotCode)),
    db
      .select({
        id: specs.id,
        probeLiquidId: specs.probeLiquidId,
        minDeg: specs.minDeg,
        maxDeg: specs.maxDeg,
        scope: specs.scope,
        maxDaysSinceTreatment: specs.maxDaysSinceTreatment,
        minSurfaceEnergyMnM: specs.minSurfaceEnergyMnM,
        maxSurfaceEnergyMnM: specs.maxSurfaceEnergyMnM,
        ...dynamicLimitColumns,
        note: specs.note,
      })
      .from(specs)
      .where(
        and(
          eq(specs.organizationId, organizationId),
          eq(specs.coatingId, coatingId),
          isNull(specs.archivedAt),
        ),
      )
      .orderBy(asc(specs.createdAt), asc(specs.id)),
  ]);
  const wanted = new Set(options.batches ?? []);
  const chosen =
    wanted.size > 0
      ? allBatches.filter((b) => wanted.has(b.id) || wanted.has(b.lotCode))
      : allBatches.slice(0, DEFAULT_BATCH_COUNT);
  const chosenIds = chosen.map((b) => b.id);
  const [drops, dynamic] = await Promise.all([
    comparisonDrops(organizationId, chosenIds, { visibility: options.visibility }),
    comparisonDynamic(organizationId, chosenIds, { visibility: options.visibility }),
  ]);
  const liquidIds = [
    ...new Set([
      ...drops.map((d) => d.probeLiquidId),
      ...dynamic.map((d) => d.probeLiquidId),
      ...specRows.map((s) => s.probeLiquidId),
    ]),
  ];
  const liquids =
    liquidIds.length === 0
      ? []
      : await db
          .select({
            id: probeLiquids.id,
            name: probeLiquids.name,
            gammaTotal: probeLiquids.totalMnM,
            gammaDispersive: probeLiquids.dispersiveMnM,
            gammaPolar: probeLiquids.polarMnM,
          })
          .from(probeLiquids)
          .where(
            and(
              inArray(probeLiquids.id, liquidIds),
              or(
                isNull(probeLiquids.organizationId),
                eq(probeLiquids.organizationId, organizationId),
              ),
            ),
          );
  return { allBatches, batches: chosen, specs: specRows, liquids, drops, dynamic };
}
