import 'server-only';
import { analysesWithPhotos } from '@/db/queries/reviews';
import type { OrgContext } from '@/lib/auth/context';
import type { StoredAnalysisResult } from '@/lib/contracts/drops';
import type { ReviewDropOverlay } from '@/lib/contracts/reviews';
import type { AnalysisWarning } from '@/lib/analysis/types';
import { compareOneBatch } from '../compare/batch';
import { decidersOfReview } from './deciders';
import { loadReview } from './load';

function overlayOf(
  result: StoredAnalysisResult,
  photo: {
    photoId: string | null;
    photoWidth: number | null;
    photoHeight: number | null;
    photoName: string | null;
  },
): ReviewDropOverlay {
  if (!photo.photoId || !photo.photoWidth || !photo.photoHeight || !('baseline' in result)) {
    return null;
  }
  return {
    photoId: photo.photoId,
    photoName: photo.photoName ?? '',
    width: photo.photoWidth,
    height: photo.photoHeight,
    baseline: result.baseline,
    contactLeft: result.contactLeft,
    contactRight: result.contactRight,
    heightPx: result.heightPx,
  };
}

/**
 * The review page: the review, each reviewed drop with its photo's overlay and warnings, and the
 * batch's statistics and spec verdicts as the compare page computes them (all results, approved
 * or not: the reviewer decides on them).
 */
export async function loadReviewPage(ctx: OrgContext, reviewId: string) {
  const organizationId = ctx.organization.id;
  const review = await loadReview(organizationId, reviewId);
  if (!review) return null;
  const [details, compared, deciders] = await Promise.all([
    analysesWithPhotos(
      organizationId,
      review.rows.map((r) => r.analysisId),
    ),
    compareOneBatch(organizationId, review.batchId, { visibility: 'all' }),
    decidersOfReview(organizationId, review.submittedByUserId),
  ]);
  const byAnalysis = new Map(details.map((d) => [d.analysisId, d]));
  const drops = review.rows.map((row) => {
    const detail = byAnalysis.get(row.analysisId);
    const warnings: AnalysisWarning[] =
      detail && 'warnings' in detail.result ? detail.result.warnings : [];
    return {
      ...row,
      warnings,
      overlay: detail ? overlayOf(detail.result, detail) : null,
    };
  });
  const comparison = compared?.comparison ?? null;
  const liquids =
    comparison?.liquids.flatMap((l) => {
      const result = l.batches.find((b) => b.batch.id === review.batchId);
      return result ? [{ liquid: l.liquid, result }] : [];
    }) ?? [];
  const surfaceEnergy = comparison?.surfaceEnergy?.batches.find(
    (b) => b.batch.id === review.batchId,
  );
  return {
    review,
    /** Who besides the submitter may decide it (four-eyes). */
    otherDeciders: deciders.others,
    drops,
    liquids,
    surfaceEnergy:
      surfaceEnergy && comparison?.surfaceEnergy
        ? { result: surfaceEnergy, coverageFactor: comparison.surfaceEnergy.coverageFactor }
        : null,
    angleBasis: comparison?.angleBasis ?? '',
    certificateHref: `/api/batches/${review.batchId}/report`,
  };
}
export type ReviewPageData = NonNullable<Awaited<ReturnType<typeof loadReviewPage>>>;
