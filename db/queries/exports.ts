import 'server-only';
import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { SampleListQuery } from '@/lib/validation/records';
import { getDb } from '../client';
import { builtInProbeLiquidId } from '../probe-liquid-library';
import { analyses, drops, probeLiquids, samples } from '../schema';
import type { Page } from './records';
import { listSamples, type SampleListItem } from './samples';

/*
 * Read models of the record tables that add results to a list (drop counts, mean angles), shared
 * by the pages and their CSV exports.
 */

export type SampleResults = {
  dropCount: number;
  waterDropCount: number;
  /** Mean of the latest analysis of each water drop, degrees; null without water drops. */
  meanWaterDeg: number | null;
};
export type SampleWithResults = SampleListItem & SampleResults;

const WATER = builtInProbeLiquidId('water');

/** Drop counts and mean water contact angle of the given samples (latest revision per drop). */
export async function sampleResults(
  organizationId: string,
  sampleIds: string[],
): Promise<Map<string, SampleResults>> {
  const out = new Map<string, SampleResults>();
  if (sampleIds.length === 0) return out;
  const latest = getDb()
    .selectDistinctOn([analyses.dropId], { dropId: analyses.dropId, meanDeg: analyses.meanDeg })
    .from(analyses)
    .where(eq(analyses.organizationId, organizationId))
    .orderBy(analyses.dropId, sql`${analyses.revision} desc`)
    .as('latest');
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
      and(
        eq(drops.organizationId, organizationId),
        inArray(drops.sampleId, sampleIds),
        isNull(drops.archivedAt),
      ),
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

/** listSamples with each sample's drop counts and mean water angle. */
export async function listSamplesWithResults(
  organizationId: string,
  query: SampleListQuery,
): Promise<Page<SampleWithResults>> {
  const page = await listSamples(organizationId, query);
  const results = await sampleResults(
    organizationId,
    page.items.map((item) => item.id),
  );
  return {
    ...page,
    items: page.items.map((item) => ({
      ...item,
      ...(results.get(item.id) ?? { dropCount: 0, waterDropCount: 0, meanWaterDeg: null }),
    })),
  };
}

/** A drop of a batch with its latest analysis, newest measurement first. */
export type BatchDrop = {
  dropId: string;
  sampleId: string;
  sampleLabel: string;
  probeLiquidName: string;
  source: string;
  measuredAt: Date;
  method: string | null;
  leftDeg: number | null;
  rightDeg: number | null;
  meanDeg: number | null;
  revision: number | null;
};

export async function listBatchDrops(
  organizationId: string,
  batchId: string,
  limit = 200,
): Promise<BatchDrop[]> {
  const latest = getDb()
    .selectDistinctOn([analyses.dropId], {
      dropId: analyses.dropId,
      method: analyses.method,
      leftDeg: analyses.leftDeg,
      rightDeg: analyses.rightDeg,
      meanDeg: analyses.meanDeg,
      revision: analyses.revision,
    })
    .from(analyses)
    .where(eq(analyses.organizationId, organizationId))
    .orderBy(analyses.dropId, sql`${analyses.revision} desc`)
    .as('latest');
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
    .where(
      and(
        eq(drops.organizationId, organizationId),
        eq(samples.batchId, batchId),
        isNull(drops.archivedAt),
      ),
    )
    .orderBy(desc(drops.measuredAt), asc(drops.id))
    .limit(limit);
}
