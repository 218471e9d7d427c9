import 'server-only';
import { listBatchDrops, listSamplesWithResults } from '@/db/queries/sample-results';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import type { BatchListQuery } from '@/lib/contracts/batches';
import { MAX_PAGE_SIZE } from '@/lib/contracts/common';
import type { SampleListQuery } from '@/lib/contracts/samples';
import { isWatching } from '../alerts/watch';
import { resultVisibility } from '../visibility';
import { findRecordOf, getRecord } from './get';
import { batchRecords, coatingRecords, probeLiquidRecords, specRecords } from './kinds';
import { listRecords } from './list';

const allCoatings = (organizationId: string) =>
  listRecords(
    coatingRecords,
    organizationId,
    coatingRecords.schemas.list.parse({ pageSize: MAX_PAGE_SIZE }),
  );

/**
 * The batch page: the batch, its coating, its samples with their results (a page of them), its
 * drops, and the coatings to move it to (for those who may edit it). Null when not here.
 */
export async function loadBatchPage(
  ctx: OrgContext,
  batchId: string,
  sampleQuery: SampleListQuery,
) {
  const organizationId = ctx.organization.id;
  const batch = await findRecordOf(batchRecords, organizationId, batchId);
  if (!batch) return null;
  const canWrite = can(ctx.organization.role, 'records:write') && !batch.archivedAt;
  const visibility = resultVisibility(ctx.organization.role);
  const [coating, samples, drops, coatings] = await Promise.all([
    getRecord(coatingRecords, organizationId, batch.coatingId),
    listSamplesWithResults(organizationId, sampleQuery, visibility),
    listBatchDrops(organizationId, batchId, visibility),
    canWrite ? allCoatings(organizationId).then((page) => page.items) : Promise.resolve([]),
  ]);
  return { batch, canWrite, coating, samples, drops, coatings };
}

/**
 * The coating page: the coating, its specs, a page of its batches, the probe liquids a spec may
 * use (for those who may edit), and whether the user watches it. Null when not here.
 */
export async function loadCoatingPage(
  ctx: OrgContext,
  coatingId: string,
  batchQuery: BatchListQuery,
) {
  const organizationId = ctx.organization.id;
  const coating = await findRecordOf(coatingRecords, organizationId, coatingId);
  if (!coating) return null;
  const role = ctx.organization.role;
  const canManage = can(role, 'catalog:manage') && !coating.archivedAt;
  const specQuery = specRecords.schemas.list.parse({ coatingId, pageSize: MAX_PAGE_SIZE });
  const [specs, batches, liquids, watching] = await Promise.all([
    listRecords(specRecords, organizationId, specQuery),
    listRecords(batchRecords, organizationId, batchQuery),
    canManage
      ? listRecords(
          probeLiquidRecords,
          organizationId,
          probeLiquidRecords.schemas.list.parse({ pageSize: MAX_PAGE_SIZE }),
        ).then((page) => page.items)
      : Promise.resolve([]),
    can(role, 'results:read-all') ? isWatching(ctx.user.id, coatingId) : Promise.resolve(null),
  ]);
  return {
    coating,
    canManage,
    specs,
    specQuery,
    batches,
    liquids,
    watching: watching?.watching ?? null,
  };
}

export { allCoatings };
