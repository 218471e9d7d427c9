import 'server-only';
import { and, eq, isNull } from 'drizzle-orm';
import { batches, probeLiquids, samples } from '../schema';
import { probeLiquidVisibleTo } from './records';
import type { Executor } from './transaction';

/*
 * What an import of hand-read angles reads, with share locks so the batch and its samples cannot
 * be archived while the import runs. The drops and analyses are written by insertDropsAndAnalyses.
 */

export async function lockBatchForImport(db: Executor, organizationId: string, batchId: string) {
  const [batch] = await db
    .select({ id: batches.id, lotCode: batches.lotCode, archivedAt: batches.archivedAt })
    .from(batches)
    .where(and(eq(batches.id, batchId), eq(batches.organizationId, organizationId)))
    .for('share');
  return batch ?? null;
}

export async function lockLiveSamplesOfBatch(db: Executor, batchId: string) {
  return db
    .select({ id: samples.id, label: samples.label })
    .from(samples)
    .where(and(eq(samples.batchId, batchId), isNull(samples.archivedAt)))
    .for('share');
}

/** The current probe liquids the organization may use (library and own). */
export async function liveProbeLiquidNames(db: Executor, organizationId: string) {
  return db
    .select({ id: probeLiquids.id, name: probeLiquids.name })
    .from(probeLiquids)
    .where(and(probeLiquidVisibleTo(organizationId), isNull(probeLiquids.archivedAt)));
}
