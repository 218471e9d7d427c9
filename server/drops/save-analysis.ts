import 'server-only';
import { auditAs } from '@/db/queries/audit';
import {
  engineAnalysisRow,
  findLiveDropOfPhoto,
  insertDropsAndAnalyses,
  lockPhotoDrops,
  moveDrop,
  nextRevision,
} from '@/db/queries/drops';
import { newId } from '@/db/queries/ids';
import { getPhoto } from '@/db/queries/photos';
import { findRecord, ownedBy, probeLiquidVisibleTo } from '@/db/queries/records';
import { inTransaction, type Transaction } from '@/db/queries/transaction';
import { measurementSessions, probeLiquids, samples } from '@/db/schema';
import { AnalysisError } from '@/lib/analysis/types';
import { AppError, notFound } from '@/lib/app-error';
import type {
  KeptAnalysisResult,
  SaveDropAnalysisInput,
  SavedDropAnalysis,
} from '@/lib/contracts/drops';
import type { Actor } from '../actor';
import { refreshVerdictOfSampleQuietly } from '../alerts/refresh-verdict';
import { emitWebhookEvent } from '../webhooks/emit';
import { runCompute } from '../compute/pool';
import { loadPhotoGray } from '../photos/pixels';
import { fromAnalysisError } from './analysis-error';

const missing = (field: string, what: string) =>
  new AppError('not_found', `${what} was not found in this organization.`, {
    fields: { [field]: `Choose a ${what.toLowerCase()} of this organization.` },
  });

const staleRevision = (current: number) =>
  new AppError(
    'stale_revision',
    `This drop was saved as revision ${current} since you loaded it (by another tab or person). Nothing was saved: reload revision ${current}, check it, then save again.`,
    { extra: { current: { revision: current } } },
  );

/** The sample, probe liquid and session a save names must be this organization's. */
export async function checkReferences(
  tx: Transaction,
  actor: Actor,
  input: Pick<SaveDropAnalysisInput, 'sampleId' | 'probeLiquidId' | 'sessionId'>,
) {
  const org = actor.organizationId;
  const sample = await findRecord<{ archivedAt: Date | null }>(
    tx,
    samples,
    ownedBy(samples, org),
    input.sampleId,
  );
  if (!sample || sample.archivedAt) throw missing('sampleId', 'Sample');
  if (!(await findRecord(tx, probeLiquids, probeLiquidVisibleTo(org), input.probeLiquidId))) {
    throw missing('probeLiquidId', 'Probe liquid');
  }
  const sessionId = input.sessionId ?? null;
  if (
    sessionId &&
    !(await findRecord(tx, measurementSessions, ownedBy(measurementSessions, org), sessionId))
  ) {
    throw missing('sessionId', 'Session');
  }
}

/**
 * Saves a photo's analysis to a sample. The server runs lib/analysis itself on the stored photo
 * with the method and baseline the user chose, so what is kept is what the engine computes, never
 * numbers sent by a browser. The first save creates the drop; every save is a new analysis
 * revision, earlier ones stay untouched. Drop, analysis and audit rows are one transaction; the
 * batch's out-of-spec verdict is refreshed after it.
 */
export async function saveDropAnalysis(
  actor: Actor,
  photoId: string,
  input: SaveDropAnalysisInput,
): Promise<SavedDropAnalysis> {
  if (!(await getPhoto(actor.organizationId, photoId))) throw notFound('That photo');
  const image = await loadPhotoGray(actor.organizationId, photoId);
  let analysed;
  try {
    // In the compute pool, off the request thread; the same lib/analysis code, the same numbers.
    analysed = await runCompute(actor.userId, {
      kind: 'analyse-drop',
      image,
      options: {
        method: input.method,
        ...(input.baseline ? { baseline: input.baseline } : {}),
        ...(input.scalePxPerMm ? { scalePxPerMm: input.scalePxPerMm } : {}),
        ...(input.settings ? { settings: input.settings } : {}),
      },
    });
  } catch (error) {
    if (error instanceof AnalysisError) {
      throw fromAnalysisError(
        error,
        'Adjust the baseline or choose another photo, then save again.',
      );
    }
    throw error;
  }
  const { edgePoints: _edgePoints, profile: _profile, ...kept } = analysed;
  const result: KeptAnalysisResult = kept;
  const sessionId = input.sessionId ?? null;

  const saved = await inTransaction(async (tx) => {
    await checkReferences(tx, actor, input);
    await lockPhotoDrops(tx, photoId);
    const audit = auditAs(tx, actor);
    const placement = { sampleId: input.sampleId, probeLiquidId: input.probeLiquidId };
    const existing = await findLiveDropOfPhoto(tx, photoId);
    const dropId = existing?.id ?? newId();
    const newDrop = existing
      ? []
      : [
          {
            id: dropId,
            organizationId: actor.organizationId,
            ...placement,
            sessionId,
            photoId,
            source: 'photo' as const,
            createdByUserId: actor.userId,
          },
        ];
    if (
      existing &&
      (existing.sampleId !== input.sampleId ||
        existing.probeLiquidId !== input.probeLiquidId ||
        existing.sessionId !== sessionId)
    ) {
      await moveDrop(tx, dropId, { ...placement, sessionId });
      await audit('drop.update', 'drop', dropId, {
        before: {
          sampleId: existing.sampleId,
          probeLiquidId: existing.probeLiquidId,
          sessionId: existing.sessionId,
        },
        after: { ...placement, sessionId },
      });
    }
    const revision = existing ? await nextRevision(tx, dropId) : 1;
    // Under the photo's lock: a save based on an older revision (another tab, another user, a
    // simultaneous save) would silently pass over the one saved in between.
    if (revision - 1 !== input.expectedRevision) throw staleRevision(revision - 1);
    const reason = input.reason?.trim() || null;
    if (existing && !reason) {
      throw new AppError(
        'invalid_input',
        'This drop is saved already: say why it is analysed again.',
        {
          fields: {
            reason:
              'Say why this drop is analysed again (e.g. baseline moved to the contact points).',
          },
        },
      );
    }
    const analysisId = newId();
    await insertDropsAndAnalyses(tx, newDrop, [
      engineAnalysisRow({
        id: analysisId,
        organizationId: actor.organizationId,
        dropId,
        revision,
        method: input.method,
        baseline: input.baseline,
        options: {
          scalePxPerMm: input.scalePxPerMm ?? null,
          baselineSource: result.baselineSource,
          settings: result.settings,
        },
        result,
        reason,
        sessionId,
        createdByUserId: actor.userId,
      }),
    ]);
    if (!existing) await audit('drop.create', 'drop', dropId, { after: { photoId, ...placement } });
    await audit('analysis.create', 'analysis', analysisId, {
      after: {
        dropId,
        revision,
        method: input.method,
        baseline: input.baseline,
        leftDeg: result.leftDeg,
        rightDeg: result.rightDeg,
        ...(reason ? { reason } : {}),
      },
    });
    await emitWebhookEvent(tx, actor.organizationId, 'analysis.saved', {
      analysisId,
      dropId,
      revision,
      sampleId: input.sampleId,
      probeLiquidId: input.probeLiquidId,
      photoId,
      method: input.method,
      leftDeg: result.leftDeg,
      rightDeg: result.rightDeg,
      meanDeg: result.meanDeg,
      warnings: result.warnings.map((w) => w.code),
      savedByUserId: actor.userId,
    });
    return { dropId, analysisId, revision };
  });
  await refreshVerdictOfSampleQuietly(actor.organizationId, input.sampleId);
  return { ...saved, result };
}
