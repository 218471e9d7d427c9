import 'server-only';
import { and, asc, desc, eq, isNull, or, sql } from 'drizzle-orm';
import { HttpError } from '@/lib/api/errors';
import { getDb } from '../client';
import {
  analyses,
  batches,
  coatings,
  drops,
  measurementSessions,
  photos,
  probeLiquids,
  samples,
} from '../schema';
import { recordAudit } from './audit';
import { newId } from './ids';

export type AnalysisToSave = {
  method: string;
  baseline: { x1: number; y1: number; x2: number; y2: number } | null;
  options: Record<string, unknown>;
  result: Record<string, unknown> & {
    leftDeg: number;
    rightDeg: number;
    meanDeg: number;
    leftUncertaintyDeg: number;
    rightUncertaintyDeg: number;
  };
  softwareVersion: string;
};

function missing(field: string, what: string) {
  return new HttpError(404, 'not_found', `${what} was not found in this organization.`, {
    [field]: `Choose a ${what.toLowerCase()} of this organization.`,
  });
}

/**
 * Saves an analysis of a photo for a sample: creates the drop on first save, and a new analysis
 * revision on every save after that. Earlier revisions are kept untouched.
 */
export async function saveDropAnalysis(input: {
  organizationId: string;
  userId: string;
  photoId: string;
  sampleId: string;
  probeLiquidId: string;
  sessionId: string | null;
  analysis: AnalysisToSave;
}): Promise<{ dropId: string; analysisId: string; revision: number }> {
  const db = getDb();
  return db.transaction(async (tx) => {
    const [photo] = await tx
      .select({ id: photos.id })
      .from(photos)
      .where(and(eq(photos.id, input.photoId), eq(photos.organizationId, input.organizationId)));
    if (!photo) throw missing('photoId', 'Photo');
    const [sample] = await tx
      .select({ id: samples.id })
      .from(samples)
      .where(
        and(
          eq(samples.id, input.sampleId),
          eq(samples.organizationId, input.organizationId),
          isNull(samples.archivedAt),
        ),
      );
    if (!sample) throw missing('sampleId', 'Sample');
    const [liquid] = await tx
      .select({ id: probeLiquids.id })
      .from(probeLiquids)
      .where(
        and(
          eq(probeLiquids.id, input.probeLiquidId),
          or(isNull(probeLiquids.organizationId), eq(probeLiquids.organizationId, input.organizationId)),
        ),
      );
    if (!liquid) throw missing('probeLiquidId', 'Probe liquid');
    if (input.sessionId) {
      const [session] = await tx
        .select({ id: measurementSessions.id })
        .from(measurementSessions)
        .where(
          and(
            eq(measurementSessions.id, input.sessionId),
            eq(measurementSessions.organizationId, input.organizationId),
          ),
        );
      if (!session) throw missing('sessionId', 'Session');
    }

    // Serialise saves of the same photo so two tabs cannot both create revision n.
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${input.photoId}))`);
    const [existing] = await tx
      .select({ id: drops.id, sampleId: drops.sampleId, probeLiquidId: drops.probeLiquidId })
      .from(drops)
      .where(and(eq(drops.photoId, input.photoId), isNull(drops.archivedAt)));

    let dropId: string;
    if (existing) {
      dropId = existing.id;
      if (existing.sampleId !== input.sampleId || existing.probeLiquidId !== input.probeLiquidId) {
        await tx
          .update(drops)
          .set({ sampleId: input.sampleId, probeLiquidId: input.probeLiquidId, sessionId: input.sessionId })
          .where(eq(drops.id, dropId));
        await recordAudit(tx, {
          actorUserId: input.userId,
          organizationId: input.organizationId,
          action: 'drop.update',
          entityType: 'drop',
          entityId: dropId,
          before: { sampleId: existing.sampleId, probeLiquidId: existing.probeLiquidId },
          after: { sampleId: input.sampleId, probeLiquidId: input.probeLiquidId },
        });
      }
    } else {
      dropId = newId();
      await tx.insert(drops).values({
        id: dropId,
        organizationId: input.organizationId,
        sampleId: input.sampleId,
        probeLiquidId: input.probeLiquidId,
        sessionId: input.sessionId,
        photoId: input.photoId,
        source: 'photo',
        createdByUserId: input.userId,
      });
      await recordAudit(tx, {
        actorUserId: input.userId,
        organizationId: input.organizationId,
        action: 'drop.create',
        entityType: 'drop',
        entityId: dropId,
        after: { photoId: input.photoId, sampleId: input.sampleId, probeLiquidId: input.probeLiquidId },
      });
    }

    const [{ next }] = await tx
      .select({ next: sql<number>`coalesce(max(${analyses.revision}), 0) + 1` })
      .from(analyses)
      .where(eq(analyses.dropId, dropId));
    const analysisId = newId();
    const { result } = input.analysis;
    await tx.insert(analyses).values({
      id: analysisId,
      organizationId: input.organizationId,
      dropId,
      revision: Number(next),
      method: input.analysis.method,
      baseline: input.analysis.baseline,
      options: input.analysis.options,
      result,
      leftDeg: result.leftDeg,
      rightDeg: result.rightDeg,
      meanDeg: result.meanDeg,
      leftUncertaintyDeg: result.leftUncertaintyDeg,
      rightUncertaintyDeg: result.rightUncertaintyDeg,
      softwareVersion: input.analysis.softwareVersion,
      createdByUserId: input.userId,
    });
    await recordAudit(tx, {
      actorUserId: input.userId,
      organizationId: input.organizationId,
      action: 'analysis.create',
      entityType: 'analysis',
      entityId: analysisId,
      after: {
        dropId,
        revision: Number(next),
        method: input.analysis.method,
        baseline: input.analysis.baseline,
        leftDeg: result.leftDeg,
        rightDeg: result.rightDeg,
      },
    });
    return { dropId, analysisId, revision: Number(next) };
  });
}

export type AnalysisRevision = {
  id: string;
  revision: number;
  method: string;
  baseline: { x1: number; y1: number; x2: number; y2: number } | null;
  leftDeg: number;
  rightDeg: number;
  meanDeg: number;
  leftUncertaintyDeg: number | null;
  rightUncertaintyDeg: number | null;
  softwareVersion: string;
  reviewStatus: string;
  createdAt: Date;
  createdByUserId: string | null;
  result: Record<string, unknown>;
};

/** The drop saved from a photo (if any) with all its analysis revisions, newest first. */
export async function getDropOfPhoto(organizationId: string, photoId: string) {
  const db = getDb();
  const [drop] = await db
    .select({
      id: drops.id,
      sampleId: drops.sampleId,
      probeLiquidId: drops.probeLiquidId,
      sessionId: drops.sessionId,
      sampleLabel: samples.label,
      lotCode: batches.lotCode,
      coatingCode: coatings.code,
    })
    .from(drops)
    .innerJoin(samples, eq(samples.id, drops.sampleId))
    .innerJoin(batches, eq(batches.id, samples.batchId))
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .where(
      and(eq(drops.photoId, photoId), eq(drops.organizationId, organizationId), isNull(drops.archivedAt)),
    );
  if (!drop) return null;
  const revisions: AnalysisRevision[] = await db
    .select({
      id: analyses.id,
      revision: analyses.revision,
      method: analyses.method,
      baseline: analyses.baseline,
      leftDeg: analyses.leftDeg,
      rightDeg: analyses.rightDeg,
      meanDeg: analyses.meanDeg,
      leftUncertaintyDeg: analyses.leftUncertaintyDeg,
      rightUncertaintyDeg: analyses.rightUncertaintyDeg,
      softwareVersion: analyses.softwareVersion,
      reviewStatus: analyses.reviewStatus,
      createdAt: analyses.createdAt,
      createdByUserId: analyses.createdByUserId,
      result: analyses.result,
    })
    .from(analyses)
    .where(eq(analyses.dropId, drop.id))
    .orderBy(desc(analyses.revision));
  return { ...drop, revisions };
}

/** Samples to save drops to, with their batch and coating, for the workspace's picker. */
export async function listSampleChoices(organizationId: string) {
  return getDb()
    .select({
      id: samples.id,
      label: samples.label,
      batchId: batches.id,
      lotCode: batches.lotCode,
      coatingCode: coatings.code,
      coatingName: coatings.name,
    })
    .from(samples)
    .innerJoin(batches, eq(batches.id, samples.batchId))
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .where(and(eq(samples.organizationId, organizationId), isNull(samples.archivedAt)))
    .orderBy(asc(coatings.code), desc(batches.producedOn), asc(samples.label))
    .limit(500);
}

export async function listProbeLiquidChoices(organizationId: string) {
  return getDb()
    .select({ id: probeLiquids.id, name: probeLiquids.name, hazardNote: probeLiquids.hazardNote })
    .from(probeLiquids)
    .where(
      and(
        or(isNull(probeLiquids.organizationId), eq(probeLiquids.organizationId, organizationId)),
        isNull(probeLiquids.archivedAt),
      ),
    )
    .orderBy(asc(probeLiquids.name));
}
