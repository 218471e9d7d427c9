import 'server-only';
import { emailVerifiedAt } from '@/db/queries/account-tokens';
import { listComparisonCoatings, loadComparison } from '@/db/queries/comparison';
import { pendingReviewCount, recentDrops } from '@/db/queries/dashboard';
import { listReviews } from '@/db/queries/reviews';
import type { OrgContext } from '@/lib/auth/context';
import { batchesOutOfSpec, buildComparison } from '@/lib/compare';
import type { OutOfSpecBatch, PendingReviewRequests } from '@/lib/contracts/dashboard';
import { resultCache } from '../cache/results';
import { resultVisibility, type ResultVisibility } from '../visibility';

/**
 * Batches (each coating's newest twelve) whose comparison verdict is fail for some liquid;
 * computed once per data version of the organization (server/cache/results.ts).
 */
export async function outOfSpecBatches(
  organizationId: string,
  options: { visibility: ResultVisibility },
): Promise<OutOfSpecBatch[]> {
  const cache = await resultCache(organizationId, options.visibility);
  return cache.get('out-of-spec', () => computeOutOfSpecBatches(organizationId, options));
}

async function computeOutOfSpecBatches(
  organizationId: string,
  options: { visibility: ResultVisibility },
): Promise<OutOfSpecBatch[]> {
  const coatings = await listComparisonCoatings(organizationId);
  const perCoating = await Promise.all(
    coatings.map(async (coating) => {
      const data = await loadComparison(organizationId, coating.id, {
        visibility: options.visibility,
      });
      return batchesOutOfSpec(buildComparison(data)).map((b) => ({
        coatingCode: coating.code,
        lotCode: b.batch.lotCode,
        producedOn: b.batch.producedOn,
        liquidName: b.liquidName,
        rule: b.rule,
        reason: b.reason,
      }));
    }),
  );
  return perCoating.flat().sort((a, b) => b.producedOn.localeCompare(a.producedOn));
}

/** The review requests waiting for a decision: how many, and the newest five to link to. */
async function pendingReviewRequests(organizationId: string): Promise<PendingReviewRequests> {
  const [count, newest] = await Promise.all([
    pendingReviewCount(organizationId),
    listReviews(organizationId, 'submitted'),
  ]);
  return {
    count,
    newest: newest.slice(0, 5).map((r) => ({
      id: r.id,
      title: `${r.coatingCode} · ${r.lotCode}${r.sampleLabel ? ` / ${r.sampleLabel}` : ''}`,
      submittedBy: r.submittedBy,
      submittedAt: r.submittedAt,
      analysisCount: r.analysisIds.length,
    })),
  };
}

/**
 * The dashboard: recent drops, batches out of spec (approved results only for those who may not
 * read every result), review requests waiting for a decision, and whether the address is confirmed.
 */
export async function loadDashboard(ctx: OrgContext) {
  const organizationId = ctx.organization.id;
  const visibility = resultVisibility(ctx.organization.role);
  const approvedOnly = visibility === 'approved';
  const [verified, drops, outOfSpec, pending] = await Promise.all([
    emailVerifiedAt(ctx.user.id),
    recentDrops(organizationId, { visibility }),
    outOfSpecBatches(organizationId, { visibility }),
    approvedOnly ? Promise.resolve(null) : pendingReviewRequests(organizationId),
  ]);
  return { emailVerified: verified !== null, approvedOnly, drops, outOfSpec, pending };
}

export { pendingReviewCount, recentDrops };
