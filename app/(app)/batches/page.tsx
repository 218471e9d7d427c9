import type { Metadata } from 'next';
import { BatchForm, BatchesTable } from '@/components/records/batches';
import {
  exportHref,
  listQueryFromPage,
  type PageSearchParams,
} from '@/components/records/list-query';
import { PageHeader } from '@/components/ui/empty-state';
import { ListFilters } from '@/components/ui/list-filters';
import { requirePage } from '@/lib/auth/guard';
import { allCoatings } from '@/server/records/detail-pages';
import { batchRecords } from '@/server/records/kinds';
import { listRecords } from '@/server/records/list';
import { can } from '@/lib/auth/permissions';
import { batchListQuerySchema } from '@/lib/contracts/batches';

export const metadata: Metadata = { title: 'Batches' };

export default async function Page({ searchParams }: { searchParams: Promise<PageSearchParams> }) {
  const ctx = await requirePage('organization:read');
  const query = listQueryFromPage(batchListQuerySchema, await searchParams);
  const [list, coatings] = await Promise.all([
    listRecords(batchRecords, ctx.organization.id, query),
    allCoatings(ctx.organization.id),
  ]);
  const role = ctx.organization.role;
  const coatingChoices = coatings.items.map((c) => ({
    value: c.id,
    label: `${c.code} · ${c.name}`,
  }));
  return (
    <>
      <PageHeader
        title="Batches"
        lead="Production and trial lots, their process parameters and samples."
      />
      <ListFilters
        label="Filter batches"
        fields={[
          {
            name: 'coatingId',
            label: 'Coating',
            type: 'select',
            options: coatingChoices,
            all: 'All coatings',
          },
          { name: 'q', label: 'Lot code or notes', type: 'text', placeholder: 'B-0412' },
          { name: 'producedFrom', label: 'Produced from', type: 'date' },
          { name: 'producedTo', label: 'Produced to', type: 'date' },
          { name: 'includeArchived', label: 'Show archived', type: 'checkbox' },
        ]}
      />
      <BatchesTable
        rows={list.items}
        total={list.total}
        page={list.page}
        pageSize={list.pageSize}
        sort={query.sort}
        dir={query.dir}
        exportHref={
          can(role, 'results:export')
            ? exportHref('/api/batches/export.csv', batchListQuerySchema, query)
            : null
        }
      />
      {can(role, 'records:write') ? (
        <details className="card mt-6" id="new-batch" open={Boolean(query.coatingId) || undefined}>
          <summary className="cursor-pointer font-semibold">Add a batch</summary>
          <div className="mt-3">
            <BatchForm coatings={coatingChoices} defaultCoatingId={query.coatingId} />
          </div>
        </details>
      ) : null}
    </>
  );
}
