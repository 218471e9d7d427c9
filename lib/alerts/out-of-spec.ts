import 'server-only';
import {
  batchIdOfSample,
  batchWithCoating,
  recordBatchVerdict,
  watchersOf,
} from '@/db/queries/alerts';
import { loadComparison } from '@/db/queries/comparison';
import { batchesOutOfSpec, buildComparison, verdictOutcomes } from '@/lib/compare';
import { appUrl } from '@/lib/config';
import { noticeMail } from '@/lib/email/messages';
import { enqueueMail } from '@/lib/email/queue';

type Outcome = 'pass' | 'fail' | 'not-enough-data' | 'no-spec';

/** A batch fails when any verdict (a probe liquid's, or surface energy) fails; else the weakest of the rest. */
function overall(outcomes: Outcome[]): Outcome {
  if (outcomes.includes('fail')) return 'fail';
  if (outcomes.includes('not-enough-data')) return 'not-enough-data';
  if (outcomes.includes('pass')) return 'pass';
  return 'no-spec';
}

/**
 * Re-judges a batch after its results changed (a saved analysis, an import). When its verdict
 * turns to fail, every watcher of the coating gets one e-mail, queued in the same transaction
 * as the stored verdict: one mail per change, none for a batch that was already failing.
 */
export async function refreshBatchVerdict(
  organizationId: string,
  batchId: string,
): Promise<Outcome | null> {
  const batch = await batchWithCoating(organizationId, batchId);
  if (!batch) return null;
  const loaded = await loadComparison(organizationId, batch.coatingId, {
    batches: [batchId],
    approvedOnly: false,
  });
  const comparison = buildComparison(loaded);
  const outcome = overall(verdictOutcomes(comparison));
  await recordBatchVerdict(organizationId, batchId, outcome, async (tx) => {
    const watchers = await watchersOf(organizationId, batch.coatingId);
    const link = `${appUrl()}/compare?coating=${encodeURIComponent(batch.coatingCode)}&batches=${encodeURIComponent(batch.lotCode)}`;
    const reasons = batchesOutOfSpec(comparison).map(
      (f) => `${f.liquidName}: ${f.rule} ${f.reason}`,
    );
    for (const watcher of watchers) {
      await enqueueMail(tx, {
        kind: 'out-of-spec',
        ...noticeMail({
          to: watcher.email,
          subject: `Out of spec: ${batch.coatingCode} batch ${batch.lotCode}`,
          paragraphs: [
            `Hello ${watcher.name},`,
            `Batch ${batch.lotCode} of ${batch.coatingCode} is now out of spec.`,
            ...reasons,
          ],
          link: { href: link, label: 'See the comparison' },
          footer: 'You get this mail because you watch this coating in Beadline.',
        }),
      });
    }
  });
  return outcome;
}

/** Runs refreshBatchVerdict without letting an alert problem undo the change that caused it. */
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
