import 'server-only';
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { getDb } from '../client';
import { dynamicAnalyses, dynamicMeasurements, videos } from '../schema';
import type { Executor } from './transaction';

/** Dynamic measurements (series of frames) and their analysis revisions: plain data access. */

export type NewVideo = typeof videos.$inferInsert;
export type NewDynamicMeasurement = typeof dynamicMeasurements.$inferInsert;
export type NewDynamicAnalysis = typeof dynamicAnalyses.$inferInsert;

export async function insertVideo(tx: Executor, row: NewVideo): Promise<void> {
  await tx.insert(videos).values(row);
}

export async function getVideo(organizationId: string, videoId: string) {
  const [row] = await getDb()
    .select()
    .from(videos)
    .where(and(eq(videos.organizationId, organizationId), eq(videos.id, videoId)));
  return row ?? null;
}

/** Serialises saves to one measurement, so two tabs cannot both create revision n. */
export async function lockMeasurement(tx: Executor, measurementId: string): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`dynamic:${measurementId}`}))`);
}

/** A live measurement of the organization. */
export async function findLiveMeasurement(tx: Executor, organizationId: string, id: string) {
  const [row] = await tx
    .select()
    .from(dynamicMeasurements)
    .where(
      and(
        eq(dynamicMeasurements.id, id),
        eq(dynamicMeasurements.organizationId, organizationId),
        isNull(dynamicMeasurements.archivedAt),
      ),
    );
  return row ?? null;
}

export async function insertMeasurement(tx: Executor, row: NewDynamicMeasurement): Promise<void> {
  await tx.insert(dynamicMeasurements).values(row);
}

export async function insertDynamicAnalysis(tx: Executor, row: NewDynamicAnalysis): Promise<void> {
  await tx.insert(dynamicAnalyses).values(row);
}

export async function nextDynamicRevision(tx: Executor, measurementId: string): Promise<number> {
  const [{ next }] = await tx
    .select({ next: sql<number>`coalesce(max(${dynamicAnalyses.revision}), 0) + 1` })
    .from(dynamicAnalyses)
    .where(eq(dynamicAnalyses.measurementId, measurementId));
  return Number(next);
}

/** Every revision of a measurement, newest first, with the newest one's result and series. */
export async function listDynamicRevisions(tx: Executor, measurementId: string) {
  return tx
    .select({
      id: dynamicAnalyses.id,
      revision: dynamicAnalyses.revision,
      method: dynamicAnalyses.method,
      advancingDeg: dynamicAnalyses.advancingDeg,
      recedingDeg: dynamicAnalyses.recedingDeg,
      hysteresisDeg: dynamicAnalyses.hysteresisDeg,
      rollOffDeg: dynamicAnalyses.rollOffDeg,
      frameCount: dynamicAnalyses.frameCount,
      reviewStatus: dynamicAnalyses.reviewStatus,
      createdAt: dynamicAnalyses.createdAt,
      result: dynamicAnalyses.result,
      series: dynamicAnalyses.series,
    })
    .from(dynamicAnalyses)
    .where(eq(dynamicAnalyses.measurementId, measurementId))
    .orderBy(desc(dynamicAnalyses.revision));
}
