import 'server-only';
import { and, asc, desc, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import type { Page } from '@/lib/contracts/common';
import type {
  BatchDrop,
  SampleListQuery,
  SampleResults,
  SampleWithResults,
} from '@/lib/contracts/samples';
import { getDb } from '../client';
import { builtInProbeLiquidId } from '../probe-liquid-library';
import { analyses, drops, probeLiquids, samples } from '../schema';
import { liveDropsOf } from './drops';
import { listSamples } from './samples';
import { visibleStatus, type ResultVisibility } from './visibility';

/*
 * Read models of the record tables that add results to a list (drop counts, mean angles), shared
 * by the pages and their CSV exports.
 */

const WATER = builtInProbeLiquidId('water');

/**
 * Each drop's latest analysis revision (the organization's), as a subquery to join; with
 * `approved` visibility only those that are approved (db/queries/visibility.ts), so a drop
 * whose latest revision is not approved has no result.
 */
function latestAnalyses(organizationId: string, visibility: ResultVisibility) {
  const latest = getDb()
    .selectDistinctOn([analyses.dropId], {
      dropId: analyses.dropId,
      method: analyses.method,
      leftDeg: analyses.leftDeg,
      rightDeg: analyses.rightDeg,
      meanDeg: analyses.meanDeg,
      revision: analyses.revision,
      reviewStatus: analyses.reviewStatus,
    })
    .from(analyses)
    .where(eq(analyses.organizationId, organizationId))
    .orderBy(analyses.dropId, sql`${analyses.revision} desc`)
    .as('every_latest');
  return getDb()
    .select({
      dropId: latest.dropId,
      method: latest.method,
      leftDeg: latest.leftDeg,
      rightDeg: latest.rightDeg,
      meanDeg: latest.meanDeg,
      revision: latest.revision,
    })
    .from(latest)
    .where(visibleStatus(visibility, latest.reviewStatus))
    .as('latest');
}

/**
 * The organization's live drops whose latest revision `visibility` shows, with `latest` joined
 * (latestAnalyses): with `all` every live drop, with `approved` those with an approved one.
 */
function liveDropsShown(
  organizationId: string,
  latest: ReturnType<typeof latestAnalyses>,
  visibility: ResultVisibility,
) {
  return and(
    liveDropsOf(organizationId),
    visibility === 'all' ? undefined : isNotNull(latest.dropId),
  );
}

/**
 * Drop counts and mean water contact angle of the given samples (latest revision per drop); with
 * `approved` visibility only the drops whose latest revision is approved count.
 */
export async function sampleResults(
  organizationId: string,
  sampleIds: string[],
  visibility: ResultVisibility,
): Promise<Map<string, SampleResults>> {
  const out = new Map<string, SampleResults>();
  if (sampleIds.length === 0) return out;
  const latest = latestAnalyses(organizationId, visibility);
  const rows = await getDb()
    .select({
      sampleId: drops.sampleId,
      dropCount: sql<number>`count(*)::int`,
      waterDropCount: sql<number>`(count(*) filter (where ${drops.probeLiquidId} = ${WATER}))::int`,
      meanWaterDeg: sql<
        number | null
      >`(avg(${latest.meanDeg}) filter (where ${drops.probeLiquidId} = ${WATER}))::float8`,
    })
    .from(drops)
    .leftJoin(latest, eq(latest.dropId, drops.id))
    .where(
      and(liveDropsShown(organizationId, latest, visibility), inArray(drops.sampleId, sampleIds)),
    )
    .groupBy(drops.sampleId);
  for (const row of rows) {
    out.set(row.sampleId, {
      dropCount: row.dropCount,
      waterDropCount: row.waterDropCount,
      meanWaterDeg: row.meanWaterDeg === null ? null : Number(row.meanWaterDeg),
    });
  }
  return out;
}

/** listSamples with each sample's drop counts and mean water angle, as `visibility` allows. */
export async function listSamplesWithResults(
  organizationId: string,
  query: SampleListQuery,
  visibility: ResultVisibility,
): Promise<Page<SampleWithResults>> {
  const page = await listSamples(organizationId, query);
  const results = await sampleResults(
    organizationId,
    page.items.map((item) => item.id),
    visibility,
  );
  return {
    ...page,
    items: page.items.map((item) => ({
      ...item,
      ...(results.get(item.id) ?? { dropCount: 0, waterDropCount: 0, meanWaterDeg: null }),
    })),
  };
}

/**
 * The drops of a batch with their latest analysis, newest measurement first; with `approved`
 * visibility only the drops whose latest revision is approved.
 */
export async function listBatchDrops(
  organizationId: string,
  batchId: string,
  visibility: ResultVisibility,
  limit = 200,
): Promise<BatchDrop[]> {
  const latest = latestAnalyses(organizationId, visibility);
  return getDb()
    .select({
      dropId: drops.id,
      sampleId: drops.sampleId,
      sampleLabel: samples.label,
      probeLiquidName: probeLiquids.name,
      source: drops.source,
      measuredAt: drops.measuredAt,
      method: latest.method,
      leftDeg: latest.leftDeg,
      rightDeg: latest.rightDeg,
      meanDeg: latest.meanDeg,
      revision: latest.revision,
    })
    .from(drops)
    .innerJoin(samples, eq(samples.id, drops.sampleId))
    .innerJoin(probeLiquids, eq(probeLiquids.id, drops.probeLiquidId))
    .leftJoin(latest, eq(latest.dropId, drops.id))
    .where(and(liveDropsShown(organizationId, latest, visibility), eq(samples.batchId, batchId)))
    .orderBy(desc(drops.measuredAt), asc(drops.id))
    .limit(limit);
}
