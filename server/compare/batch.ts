import 'server-only';
import { findBatchWithCoating } from '@/db/queries/batches';
import { loadComparison } from '@/db/queries/comparison';
import { buildComparison, type Comparison } from '@/lib/compare';
import type { ResultVisibility } from '@/db/queries/visibility';

export type BatchWithCoating = NonNullable<Awaited<ReturnType<typeof findBatchWithCoating>>>;

/**
 * One batch of the organization compared against its coating's specs with lib/compare, as the
 * compare page does (statistics, verdicts, surface energy). Null when there is no such batch.
 */
export async function compareOneBatch(
  organizationId: string,
  batchId: string,
  options: { visibility: ResultVisibility },
): Promise<{ batch: BatchWithCoating; comparison: Comparison } | null> {
  const batch = await findBatchWithCoating(organizationId, batchId);
  if (!batch) return null;
  const loaded = await loadComparison(organizationId, batch.coatingId, {
    batches: [batch.id],
    visibility: options.visibility,
  });
  const comparison = buildComparison({
    batches: loaded.batches,
    liquids: loaded.liquids,
    specs: loaded.specs,
    drops: loaded.drops,
    dynamic: loaded.dynamic,
  });
  return { batch, comparison };
}
