import 'server-only';
import {
  findReview,
  latestAnalysesUnder,
  listBatchesWithResults,
  listReviews,
} from '@/db/queries/reviews';
import { can, type Role } from '@/lib/auth/permissions';

/** A review with the rows it covers that are still each drop's latest revision. */
export async function loadReview(organizationId: string, reviewId: string) {
  const review = await findReview(organizationId, reviewId);
  if (!review) return null;
  const current = await latestAnalysesUnder(organizationId, review.batchId, review.sampleId);
  const reviewed = new Set(review.analysisIds);
  const rows = current.filter((r) => reviewed.has(r.analysisId));
  return {
    ...review,
    rows: rows.map((r) => ({ ...r, superseded: false })),
    /** Drops re-analysed since submission: their reviewed revision is no longer the latest. */
    supersededCount: review.analysisIds.length - rows.length,
  };
}
export type LoadedReview = NonNullable<Awaited<ReturnType<typeof loadReview>>>;

export { listReviews };

/** The reviews page: waiting and decided reviews, and the batches an analyst may submit. */
export async function loadReviewsPage(organizationId: string, role: Role) {
  const [pending, decided, batches] = await Promise.all([
    listReviews(organizationId, 'submitted'),
    listReviews(organizationId, 'decided'),
    can(role, 'records:write') ? listBatchesWithResults(organizationId) : Promise.resolve([]),
  ]);
  return { pending, decided, batches };
}
