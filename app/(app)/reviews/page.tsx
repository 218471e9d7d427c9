import type { Metadata } from 'next';
import Link from 'next/link';
import { SubmitForReviewForm } from '@/components/reviews/submit-form';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { PlainTable } from '@/components/ui/plain-table';
import { requirePage } from '@/lib/auth/guard';
import { can } from '@/lib/auth/permissions';
import { loadReviewsPage } from '@/server/reviews/load';

export const metadata: Metadata = { title: 'Reviews' };

const STATUS_STYLE: Record<string, string> = {
  submitted: 'bg-amber-100 text-amber-900',
  approved: 'bg-leaf-100 text-leaf-900',
  rejected: 'bg-coral-100 text-coral-900',
  withdrawn: 'bg-ink-100 text-ink-700',
  revoked: 'bg-amber-100 text-amber-900',
};

export default async function ReviewsPage() {
  const ctx = await requirePage('organization:read');
  const role = ctx.organization.role;
  if (!can(role, 'results:read-all')) {
    return (
      <>
        <PageHeader
          title="Reviews"
          lead="Results are shown to you once a reviewer has approved them."
        />
        <EmptyState title="Nothing to review">
          Reviews are done by the lab&apos;s reviewers.
        </EmptyState>
      </>
    );
  }
  const { pending, decided, batches } = await loadReviewsPage(ctx.organization.id, role);
  const table = (rows: typeof pending, emptyText: string, label: string) =>
    rows.length === 0 ? (
      <p className="text-sm text-ink-600">{emptyText}</p>
    ) : (
      <PlainTable label={label} head={['Results', 'Drops', 'Submitted', 'Status']}>
        {rows.map((r) => (
          <tr key={r.id} className="border-b border-ink-100 last:border-0">
            <td className="py-2 pr-3">
              <Link
                href={`/reviews/${r.id}`}
                className="font-medium text-lagoon-700 hover:underline"
              >
                {r.coatingCode} · {r.lotCode}
                {r.sampleLabel ? ` / ${r.sampleLabel}` : ''}
              </Link>
            </td>
            <td className="py-2 pr-3 font-mono">{r.analysisIds.length}</td>
            <td className="py-2 pr-3 text-ink-700">
              {r.submittedBy ?? '—'}, {r.submittedAt.toISOString().slice(0, 10)}
            </td>
            <td className="py-2 pr-3">
              <span className={`rounded px-2 py-0.5 text-xs font-medium ${STATUS_STYLE[r.status]}`}>
                {r.status}
              </span>
              {r.decidedBy ? (
                <span className="ml-2 text-xs text-ink-500">by {r.decidedBy}</span>
              ) : null}
            </td>
          </tr>
        ))}
      </PlainTable>
    );
  return (
    <>
      <PageHeader
        title="Reviews"
        lead="Results count once someone accountable has signed them. Analysts submit a batch's results; reviewers approve with their signature or reject with a comment."
      />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <div className="space-y-6">
          <section className="card">
            <h2 className="mb-3">Waiting for review</h2>
            {table(pending, 'Nothing is waiting for review.', 'Waiting for review')}
          </section>
          <section className="card">
            <h2 className="mb-3">Decided</h2>
            {table(decided, 'No review has been decided yet.', 'Decided reviews')}
          </section>
        </div>
        {can(role, 'records:write') ? (
          <section className="card h-fit">
            <h2 className="mb-3">Submit results</h2>
            <SubmitForReviewForm batches={batches} />
          </section>
        ) : null}
      </div>
    </>
  );
}
