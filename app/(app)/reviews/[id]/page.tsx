import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { ReviewDecisionForm } from '@/components/reviews/decision-form';
import { RevokeApprovalForm } from '@/components/reviews/revoke-form';
import { PageHeader } from '@/components/ui/empty-state';
import { ReviewBatchVerdict, ReviewDrops } from '@/components/reviews/review-evidence';
import { requirePage } from '@/lib/auth/guard';
import { can } from '@/lib/auth/permissions';
import { loadReviewPage } from '@/server/reviews/page';

export const metadata: Metadata = { title: 'Review' };

export default async function ReviewPage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePage('results:read-all');
  const { id } = await params;
  const page = await loadReviewPage(ctx, id);
  if (!page) notFound();
  const { review, otherDeciders } = page;
  const mayDecide = can(ctx.organization.role, 'review:decide');
  const ownReview = review.submittedByUserId === ctx.user.id;
  const title = `${review.coatingCode} · ${review.lotCode}${review.sampleLabel ? ` / ${review.sampleLabel}` : ''}`;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/reviews" className="text-lagoon-700 hover:underline">
          ← Reviews
        </Link>
      </p>
      <PageHeader
        title={`Review of ${title}`}
        lead={`Submitted by ${review.submittedBy ?? 'a former member'} on ${review.submittedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC. Status: ${review.status}.`}
      />
      {review.submitNote ? (
        <p className="mb-4 rounded-md bg-white px-3 py-2 text-sm">Note: {review.submitNote}</p>
      ) : null}
      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_26rem]">
        <section className="card">
          <h2 className="mb-3">Results under review</h2>
          {review.supersededCount > 0 ? (
            <p className="mb-3 rounded-md bg-amber-50 px-3 py-2 text-sm text-amber-900">
              {review.supersededCount} of the submitted results were re-analysed since submission;
              they need a new review.
            </p>
          ) : null}
          <ReviewDrops drops={page.drops} />
        </section>
        <div className="space-y-6">
          <section className="card" aria-labelledby="batch-verdict">
            <h2 id="batch-verdict" className="mb-3">
              Batch {review.lotCode}: statistics and spec verdict
            </h2>
            <ReviewBatchVerdict
              liquids={page.liquids}
              surfaceEnergy={page.surfaceEnergy}
              angleBasis={page.angleBasis}
            />
            <p className="mt-3 text-sm">
              <a
                href={page.certificateHref}
                className="text-lagoon-700 underline"
                data-testid="certificate-preview"
              >
                Preview the certificate (PDF)
              </a>
            </p>
          </section>
          <section className="card h-fit">
            {review.status === 'submitted' ? (
              mayDecide && !ownReview ? (
                <>
                  <h2 className="mb-3">Decision</h2>
                  <ReviewDecisionForm reviewId={review.id} />
                </>
              ) : (
                <div className="space-y-2 text-sm" data-testid="review-waiting">
                  <p className="text-ink-600">Waiting for a reviewer.</p>
                  {otherDeciders.length === 0 ? (
                    <p className="rounded-md bg-amber-50 px-3 py-2 text-amber-900">
                      {ownReview
                        ? 'You submitted this review, so you cannot decide it, and'
                        : 'Only the submitter of this review may decide reviews here, and a submitter never decides their own review, so'}{' '}
                      no other member of this lab may approve or reject it. An admin can invite a
                      reviewer on the{' '}
                      <Link href="/team" className="text-lagoon-700 hover:underline">
                        Team page
                      </Link>
                      .
                    </p>
                  ) : ownReview ? (
                    <p>
                      You submitted this review, so another member decides it (four-eyes):{' '}
                      {otherDeciders.join(', ')}.
                    </p>
                  ) : null}
                </div>
              )
            ) : (
              <div className="space-y-2 text-sm" data-testid="review-outcome">
                <h2>
                  {
                    {
                      approved: 'Approved and signed',
                      rejected: 'Rejected',
                      withdrawn: 'Withdrawn',
                      revoked: 'Approval revoked',
                    }[review.status]
                  }
                </h2>
                <p>
                  By {review.decidedBy ?? '—'} on{' '}
                  {review.decidedAt?.toISOString().slice(0, 16).replace('T', ' ')} UTC
                </p>
                {review.decisionComment ? <p>Comment: {review.decisionComment}</p> : null}
                {review.signature ? (
                  <p className="break-all text-xs text-ink-500">
                    Signature: {review.signature.name} ({review.signature.email}), password
                    reconfirmed; digest {review.signature.digest.slice(0, 16)}…
                  </p>
                ) : null}
                {review.status === 'revoked' ? (
                  <p className="rounded-md bg-amber-50 px-3 py-2 text-amber-900">
                    Revoked by {review.revokedBy ?? '—'} on{' '}
                    {review.revokedAt?.toISOString().slice(0, 16).replace('T', ' ')} UTC. Reason:{' '}
                    {review.revokeReason}
                  </p>
                ) : null}
                {review.status === 'approved' && mayDecide ? (
                  <RevokeApprovalForm reviewId={review.id} />
                ) : null}
              </div>
            )}
          </section>
        </div>
      </div>
    </>
  );
}
