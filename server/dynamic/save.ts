import 'server-only';
import { auditAs } from '@/db/queries/audit';
import {
  findLiveMeasurement,
  getVideo,
  insertDynamicAnalysis,
  insertMeasurement,
  lockMeasurement,
  nextDynamicRevision,
} from '@/db/queries/dynamic';
import { newId } from '@/db/queries/ids';
import { inTransaction } from '@/db/queries/transaction';
import { AppError, notFound } from '@/lib/app-error';
import {
  MAX_VIDEO_BYTES,
  type SaveDynamicInput,
  type SavedDynamic,
  type StoredDynamicOptions,
} from '@/lib/contracts/dynamic';
import type { ReanalyseReply, ReanalyseRequest } from '@/lib/dynamic/node/reanalyse';
import { SOFTWARE_VERSION } from '@/lib/measure/version';
import { fetchStoredFile } from '@/lib/uploads/file-router';
import type { Actor } from '../actor';
import { refreshVerdictOfSampleQuietly } from '../alerts/refresh-verdict';
import { checkReferences } from '../drops/save-analysis';
import { loadPhotoBytes } from '../photos/pixels';
import { analyseInWorker } from './analyse-in-worker';
import { withTempFile } from './temp-file';

/** The stored source, fetched and re-analysed in the worker thread. */
async function reanalyse(actor: Actor, input: SaveDynamicInput): Promise<ReanalyseReply> {
  const common: Omit<ReanalyseRequest, 'source'> = {
    kind: input.kind,
    method: input.method,
    ...(input.windows ? { windows: input.windows } : {}),
    ...(input.tilt ? { tilt: input.tilt } : {}),
    ...(input.downhillSide ? { downhillSide: input.downhillSide } : {}),
    ...(input.overTime ? { overTime: input.overTime } : {}),
  };
  const { source } = input;
  if (source.type === 'frames') {
    const images = [];
    for (const photoId of source.photoIds) {
      try {
        images.push(new Uint8Array((await loadPhotoBytes(actor.organizationId, photoId)).bytes));
      } catch (error) {
        if (error instanceof AppError && error.code === 'not_found')
          throw new AppError(
            'not_found',
            'A frame of the series was not found in this organization.',
            {
              fields: { source: 'Upload every frame of the series again.' },
            },
          );
        throw error;
      }
    }
    return analyseInWorker({ ...common, source: { type: 'frames', images, fps: source.fps } });
  }
  const video = await getVideo(actor.organizationId, source.videoId);
  if (!video)
    throw new AppError('not_found', 'That video was not found in this organization.', {
      fields: { source: 'Upload the video again.' },
    });
  const bytes = await fetchStoredFile(video.url, { maxBytes: MAX_VIDEO_BYTES });
  if (bytes.length > MAX_VIDEO_BYTES)
    throw new AppError(
      'unreadable_video',
      'The stored video is larger than 512 MB; shorten it and upload it again.',
    );
  return withTempFile(bytes, (file) =>
    analyseInWorker({
      ...common,
      source: { type: 'video', path: file, ...(source.fps ? { fps: source.fps } : {}) },
    }),
  );
}

/**
 * Saves a dynamic measurement (a series of frames of one drop) to a sample. The server decodes
 * the stored source (the video through the upload service, or the frame photos) and analyses it
 * with lib/dynamic in a worker thread before anything is written, so what is kept is what the
 * engine computes. The first save makes the measurement; a save naming `measurementId` adds a
 * revision (earlier ones stay). Measurement, analysis and audit rows are one transaction; the
 * batch's verdict is refreshed after it.
 */
export async function saveDynamicMeasurement(
  actor: Actor,
  input: SaveDynamicInput,
): Promise<SavedDynamic> {
  const { fps, result, series } = await reanalyse(actor, input);
  if (result.failedFrameCount === result.frameCount)
    throw new AppError(
      'no_drop_found',
      'No frame of the series could be analysed; check that the drop and the substrate are in view, then save again.',
    );
  const options: StoredDynamicOptions = {
    fps,
    ...(input.windows ? { windows: input.windows } : {}),
    ...(input.tilt ? { tilt: input.tilt } : {}),
    ...(input.downhillSide ? { downhillSide: input.downhillSide } : {}),
    ...(input.overTime ? { overTime: input.overTime } : {}),
  };
  const saved = await inTransaction(async (tx) => {
    await checkReferences(tx, actor, input);
    const audit = auditAs(tx, actor);
    let measurementId = input.measurementId;
    let revision = 1;
    if (measurementId) {
      await lockMeasurement(tx, measurementId);
      const existing = await findLiveMeasurement(tx, actor.organizationId, measurementId);
      if (!existing) throw notFound('That dynamic measurement');
      const { source } = input;
      const sameSource =
        source.type === 'video'
          ? existing.videoId === source.videoId
          : JSON.stringify(existing.framePhotoIds) === JSON.stringify(source.photoIds);
      if (!sameSource || existing.sampleId !== input.sampleId || existing.kind !== input.kind)
        throw new AppError(
          'invalid_input',
          'A new revision re-analyses the same source of the same sample and kind; leave out measurementId to save a new measurement.',
          { fields: { measurementId: 'This measurement has another source, sample or kind.' } },
        );
      revision = await nextDynamicRevision(tx, measurementId);
    } else {
      measurementId = newId();
      const { source } = input;
      await insertMeasurement(tx, {
        id: measurementId,
        organizationId: actor.organizationId,
        sampleId: input.sampleId,
        probeLiquidId: input.probeLiquidId,
        sessionId: input.sessionId ?? null,
        kind: input.kind,
        sourceType: source.type,
        videoId: source.type === 'video' ? source.videoId : null,
        framePhotoIds: source.type === 'frames' ? source.photoIds : null,
        fps,
        createdByUserId: actor.userId,
      });
      await audit('dynamic.create', 'dynamic_measurement', measurementId, {
        after: {
          sampleId: input.sampleId,
          probeLiquidId: input.probeLiquidId,
          kind: input.kind,
          source:
            source.type === 'video'
              ? { videoId: source.videoId }
              : { frames: source.photoIds.length },
          fps,
        },
      });
    }
    const analysisId = newId();
    await insertDynamicAnalysis(tx, {
      id: analysisId,
      organizationId: actor.organizationId,
      measurementId,
      revision,
      method: input.method,
      options,
      result,
      series,
      advancingDeg: result.advancing?.meanDeg ?? null,
      advancingSdDeg: result.advancing?.sdDeg ?? null,
      advancingFrames: result.advancing?.frameCount ?? null,
      recedingDeg: result.receding?.meanDeg ?? null,
      recedingSdDeg: result.receding?.sdDeg ?? null,
      recedingFrames: result.receding?.frameCount ?? null,
      hysteresisDeg: result.hysteresisDeg,
      rollOffDeg: result.rollOff?.tiltDeg ?? null,
      frameCount: result.frameCount,
      flaggedFrameCount: result.flaggedFrameCount + result.failedFrameCount,
      softwareVersion: SOFTWARE_VERSION,
      createdByUserId: actor.userId,
    });
    await audit('dynamic_analysis.create', 'dynamic_analysis', analysisId, {
      after: {
        measurementId,
        revision,
        method: input.method,
        advancingDeg: result.advancing?.meanDeg ?? null,
        recedingDeg: result.receding?.meanDeg ?? null,
        hysteresisDeg: result.hysteresisDeg,
        rollOffDeg: result.rollOff?.tiltDeg ?? null,
      },
    });
    return { measurementId, analysisId, revision };
  });
  await refreshVerdictOfSampleQuietly(actor.organizationId, input.sampleId);
  return { ...saved, result };
}
