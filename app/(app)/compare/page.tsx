import type { Metadata } from 'next';
import { CompareControls } from '@/components/compare/compare-controls';
import { ComparisonView } from '@/components/compare/comparison-view';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { parseCompareQuery } from '@/lib/compare/query';
import { DEFAULT_BATCH_COUNT, loadComparePage } from '@/server/compare/load';
import './print.css';

export const metadata: Metadata = { title: 'Compare' };

export default async function ComparePage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const ctx = await requirePage('organization:read');
  const query = parseCompareQuery(await searchParams);
  const { approvedOnly, coatings, coating, data, comparison, reference, chosenLots, unknownBatches, exportHref } =
    await loadComparePage(ctx, query);
  const header = (
    <PageHeader
      title="Compare"
      lead="Batches side by side against their specs, with the statistics behind each verdict."
    />
  );

  if (coatings.length === 0) {
    return (
      <div className="compare-page">
        {header}
        <EmptyState title="Nothing to compare yet">
          Comparisons need a coating with batches and measured drops. Add a coating and its batches first.
        </EmptyState>
      </div>
    );
  }


  return (
    <div className="compare-page">
      {header}
      <CompareControls
        key={`${coating?.id ?? ''}|${chosenLots.join(',')}|${reference?.lotCode ?? ''}`}
        coatings={coatings}
        coatingCode={coating?.code ?? null}
        batches={data?.allBatches ?? []}
        chosen={chosenLots}
        reference={reference?.lotCode ?? null}
      />

      {query.coating && !coating ? (
        <p role="alert" className="mb-4 rounded-md border border-coral-500 bg-coral-50 px-4 py-3 text-sm text-coral-900">
          There is no coating &ldquo;{query.coating}&rdquo; in {ctx.organization.name}. Choose one from the list.
        </p>
      ) : null}
      {unknownBatches.length > 0 ? (
        <p role="alert" className="mb-4 rounded-md border border-amber-500 bg-amber-50 px-4 py-3 text-sm text-amber-900">
          Not batches of {coating?.code}: {unknownBatches.join(', ')}. They are left out; tick the batches to compare above.
        </p>
      ) : null}
      {query.ref && coating && !reference ? (
        <p role="alert" className="mb-4 rounded-md border border-amber-500 bg-amber-50 px-4 py-3 text-sm text-amber-900">
          The reference batch &ldquo;{query.ref}&rdquo; is not among the compared batches, so no batch is tested against it.
        </p>
      ) : null}

      {!coating || !data || !comparison ? (
        <EmptyState title="Choose a coating">
          Pick a coating above; its newest {DEFAULT_BATCH_COUNT} batches are compared unless you tick others.
        </EmptyState>
      ) : data.batches.length === 0 ? (
        <EmptyState title="No batches yet">{coating.code} has no batches to compare yet.</EmptyState>
      ) : (
        <>
          <div className="mb-4 flex flex-wrap items-baseline justify-between gap-3">
            <p className="text-sm text-ink-700">
              <span className="font-medium">
                {coating.code} — {coating.name}
              </span>
              : {data.batches.length} batch{data.batches.length === 1 ? '' : 'es'}, {data.drops.length} drop
              {data.drops.length === 1 ? '' : 's'}
              {reference ? `, reference batch ${reference.lotCode}` : ''}.
              {approvedOnly ? ' Approved results only.' : ' Latest analysis of every drop, whatever its review status.'}
            </p>
            <div className="print-hidden flex gap-2">
              {exportHref ? (
                <a className="btn-quiet" href={exportHref} download>
                  Raw drops (CSV)
                </a>
              ) : null}
            </div>
          </div>
          {data.drops.length === 0 ? (
            <EmptyState title="No drops to compare">
              {approvedOnly
                ? 'None of these batches has approved results yet. Results appear here once a reviewer approves them.'
                : 'None of these batches has measured drops yet. Measure drops on their samples first.'}
            </EmptyState>
          ) : (
            <ComparisonView comparison={comparison} />
          )}
        </>
      )}
    </div>
  );
}
