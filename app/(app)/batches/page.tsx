import type { Metadata } from 'next';
import { BatchForm, BatchesTable } from '@/components/records/batches';
import {
  listQueryFromPage,
  listTableProps,
  type PageSearchParams,
} from '@/components/records/list-query';
import { RecordListPage } from '@/components/records/record-pages';
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
    <RecordListPage
      title="Batches"
      lead="Production and trial lots, their process parameters and samples."
      filters={{
        label: 'Filter batches',
        fields: [
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
        ],
      }}
      add={
        can(role, 'records:write')
          ? {
              summary: 'Add a batch',
              id: 'new-batch',
              open: Boolean(query.coatingId),
              form: <BatchForm coatings={coatingChoices} defaultCoatingId={query.coatingId} />,
            }
          : null
      }
    >
      <BatchesTable
        {...listTableProps(list, query, {
          path: '/api/batches/export.csv',
          schema: batchListQuerySchema,
          allowed: can(role, 'results:export'),
        })}
      />
    </RecordListPage>
  );
}
