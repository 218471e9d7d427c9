import Link from 'next/link';
import type { OutOfSpecBatch, PendingReviewRequests, RecentDrop } from '@/lib/contracts/dashboard';
import { fmtUtc } from '@/components/ui/format';
import { PlainTable } from '@/components/ui/plain-table';

const STATUS: Record<RecentDrop['reviewStatus'], string> = {
  draft: 'Draft',
  submitted: 'Submitted',
  approved: 'Approved',
  rejected: 'Rejected',
};

export function RecentDrops({
  drops,
  approvedOnly,
}: {
  drops: RecentDrop[];
  approvedOnly: boolean;
}) {
  return (
    <section className="card lg:col-span-2" aria-labelledby="recent-drops">
      <h2 id="recent-drops">Recent drops</h2>
      {drops.length === 0 ? (
        <p className="mt-2 text-sm text-ink-600">
          {approvedOnly
            ? 'No approved results yet. Drops appear here once a reviewer approves them.'
            : 'No drop photos have been measured in this organization yet.'}
        </p>
      ) : (
        <div className="mt-3">
          <PlainTable
            testId="recent-drops"
            className="min-w-[36rem]"
            head={[
              'Sample',
              'Liquid',
              { label: 'Mean angle', align: 'right' },
              'When',
              'Who',
              'Status',
            ]}
          >
            {drops.map((d) => (
              <tr key={d.dropId} className="border-t border-ink-100">
                <td className="py-1.5 pr-3">
                  <span className="font-mono">{d.lotCode}</span> · {d.sampleLabel}
                  <span className="block text-xs text-ink-500">{d.coatingCode}</span>
                </td>
                <td className="py-1.5 pr-3">{d.liquidName}</td>
                <td className="py-1.5 pr-3 text-right tabular-nums">{d.meanDeg.toFixed(1)}°</td>
                <td className="py-1.5 pr-3 whitespace-nowrap">{fmtUtc(d.measuredAt)}</td>
                <td className="py-1.5 pr-3">{d.measuredBy ?? 'Former member'}</td>
                <td className="py-1.5">{STATUS[d.reviewStatus]}</td>
              </tr>
            ))}
          </PlainTable>
        </div>
      )}
    </section>
  );
}

export function PendingReviews({ pending }: { pending: PendingReviewRequests | null }) {
  return (
    <section className="card lg:col-span-3" aria-labelledby="pending-reviews">
      <h2 id="pending-reviews">Review requests</h2>
      {pending === null ? (
        <p className="mt-2 text-sm text-ink-600">
          Reviews are handled by reviewers; you see results once they are approved.
        </p>
      ) : (
        <div className="mt-2 flex flex-wrap items-start gap-x-8 gap-y-3">
          <Link href="/reviews" className="group block">
            <span
              className="block text-3xl font-semibold tabular-nums text-ink-950 group-hover:underline"
              data-testid="pending-reviews-count"
            >
              {pending.count}
            </span>
            <span className="text-sm text-ink-600 group-hover:underline">
              {pending.count === 0
                ? 'Nothing is waiting for review.'
                : `${pending.count === 1 ? 'request is' : 'requests are'} waiting for a reviewer.`}
            </span>
          </Link>
          {pending.newest.length > 0 ? (
            <ul className="min-w-0 flex-1 space-y-1 text-sm" data-testid="pending-reviews">
              {pending.newest.map((r) => (
                <li key={r.id}>
                  <Link href={`/reviews/${r.id}`} className="font-medium text-lagoon-700 underline">
                    {r.title}
                  </Link>{' '}
                  <span className="text-ink-600">
                    {r.analysisCount} result{r.analysisCount === 1 ? '' : 's'} from{' '}
                    {r.submittedBy ?? 'a former member'},{' '}
                    <span className="whitespace-nowrap">{fmtUtc(r.submittedAt)}</span>
                  </span>
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      )}
    </section>
  );
}

export function OutOfSpec({ batches }: { batches: OutOfSpecBatch[] }) {
  return (
    <section className="card lg:col-span-3" aria-labelledby="out-of-spec">
      <h2 id="out-of-spec">Batches out of spec</h2>
      {batches.length === 0 ? (
        <p className="mt-2 text-sm text-ink-600">
          No batch fails its spec among each coating&apos;s newest 12 batches.
        </p>
      ) : (
        <ul className="mt-2 divide-y divide-ink-100 text-sm" data-testid="out-of-spec">
          {batches.map((b) => (
            <li key={`${b.coatingCode}-${b.lotCode}-${b.liquidName}`} className="py-2">
              <Link
                className="font-mono font-medium text-lagoon-700 underline"
                href={`/compare?coating=${encodeURIComponent(b.coatingCode)}`}
              >
                {b.coatingCode} {b.lotCode}
              </Link>{' '}
              <span className="text-ink-500">
                ({b.producedOn}, {b.liquidName})
              </span>
              <span className="block text-ink-700">
                Fails: {b.rule}. {b.reason}
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
