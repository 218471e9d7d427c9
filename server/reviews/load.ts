import 'server-only';
import {
  findReview,
  latestAnalysesUnder,
  listBatchesWithResults,
  listReviews,
} from '@/db/queries/reviews';
import { can, type Role } from '@/lib/auth/permissions';
import { decidersOfReview } from './deciders';

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

/**
 * The review page: the review, and who besides its submitter may decide it (four-eyes), so the
 * page can tell the submitter who decides, or a lab with a single reviewer to invite another.
 */
export async function loadReviewPage(organizationId: string, reviewId: string) {
  const review = await loadReview(organizationId, reviewId);
  if (!review) return null;
  const { others } = await decidersOfReview(organizationId, review.submittedByUserId);
  return { review, otherDeciders: others };
}

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
