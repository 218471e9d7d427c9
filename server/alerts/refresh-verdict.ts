import 'server-only';
import {
  batchIdOfSample,
  findBatchVerdict,
  lockBatchVerdict,
  saveBatchVerdict,
  watchersOf,
} from '@/db/queries/alerts';
import { recordAudit } from '@/db/queries/audit';
import { findBatchWithCoating } from '@/db/queries/batches';
import { loadComparison } from '@/db/queries/comparison';
import { inTransaction } from '@/db/queries/transaction';
import { outOfSpecMail, overallOutcome, type BatchOutcome } from '@/lib/alerts/out-of-spec';
import { batchesOutOfSpec, buildComparison, verdictOutcomes } from '@/lib/compare';
import { appUrl } from '@/lib/config';
import { enqueueMail } from '../mail/queue';
import { emitWebhookEvent } from '../webhooks/emit';
import { resultVisibility } from '../visibility';

/**
 * Re-judges a batch after its results changed (a saved analysis, an import) and stores its
 * verdict. When the verdict turns to fail, the audit row and one mail per watcher of the coating
 * are written in the same transaction as the verdict: one mail per change, none for a batch that
 * was already failing.
 */
export async function refreshBatchVerdict(
  organizationId: string,
  batchId: string,
): Promise<BatchOutcome | null> {
  const batch = await findBatchWithCoating(organizationId, batchId);
  if (!batch) return null;
  const loaded = await loadComparison(organizationId, batch.coatingId, {
    batches: [batchId],
    visibility: 'all',
  });
  const comparison = buildComparison(loaded);
  const outcome = overallOutcome(verdictOutcomes(comparison));
  await inTransaction(async (tx) => {
    await lockBatchVerdict(tx, batchId);
    const previous = await findBatchVerdict(tx, batchId);
    await saveBatchVerdict(tx, { organizationId, batchId, outcome });
    if (outcome !== previous) {
      await emitWebhookEvent(tx, organizationId, 'batch.verdict_changed', {
        batchId,
        lotCode: batch.lotCode,
        coatingId: batch.coatingId,
        coatingCode: batch.coatingCode,
        previous,
        verdict: outcome,
      });
    }
    if (outcome !== 'fail' || previous === 'fail') return;
    await recordAudit(tx, {
      actorUserId: null,
      organizationId,
      action: 'batch.out_of_spec',
      entityType: 'batch',
      entityId: batchId,
      before: { outcome: previous },
      after: { outcome },
    });
    const link = `${appUrl()}/compare?coating=${encodeURIComponent(batch.coatingCode)}&batches=${encodeURIComponent(batch.lotCode)}`;
    const reasons = batchesOutOfSpec(comparison).map(
      (f) => `${f.liquidName}: ${f.rule} ${f.reason}`,
    );
    // The verdict counts every latest result: only watchers who may see them all are told.
    const watchers = (await watchersOf(tx, organizationId, batch.coatingId)).filter(
      (w) => resultVisibility(w.role) === 'all',
    );
    for (const { role: _role, ...watcher } of watchers) {
      await enqueueMail(tx, {
        kind: 'out-of-spec',
        ...outOfSpecMail({
          to: watcher,
          coatingCode: batch.coatingCode,
          lotCode: batch.lotCode,
          reasons,
          link,
        }),
      });
    }
  });
  return outcome;
}

/**
 * Runs refreshBatchVerdict after a change is committed, without letting an alert problem undo
 * or fail the change that caused it (the verdict is refreshed again by the next change).
 */
export async function refreshBatchVerdictQuietly(
  organizationId: string,
  batchId: string,
): Promise<void> {
  try {
    await refreshBatchVerdict(organizationId, batchId);
  } catch (error) {
    console.error('[alerts] could not re-judge batch', batchId, error);
  }
}

/** The same, for the batch a sample belongs to. */
export async function refreshVerdictOfSampleQuietly(
  organizationId: string,
  sampleId: string,
): Promise<void> {
  const batchId = await batchIdOfSample(organizationId, sampleId).catch(() => null);
  if (batchId) await refreshBatchVerdictQuietly(organizationId, batchId);
}
