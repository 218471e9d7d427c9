import type { Metadata } from 'next';
import { CoatingForm, CoatingsTable } from '@/components/records/coatings';
import {
  exportHref,
  listQueryFromPage,
  type PageSearchParams,
} from '@/components/records/list-query';
import { PageHeader } from '@/components/ui/empty-state';
import { ListFilters } from '@/components/ui/list-filters';
import { requirePage } from '@/lib/auth/guard';
import { coatingRecords } from '@/server/records/kinds';
import { listRecords } from '@/server/records/list';
import { can } from '@/lib/auth/permissions';
import { coatingListQuerySchema } from '@/lib/contracts/coatings';

export const metadata: Metadata = { title: 'Coatings' };

export default async function Page({ searchParams }: { searchParams: Promise<PageSearchParams> }) {
  const ctx = await requirePage('organization:read');
  const query = listQueryFromPage(coatingListQuerySchema, await searchParams);
  const list = await listRecords(coatingRecords, ctx.organization.id, query);
  const role = ctx.organization.role;
  return (
    <>
      <PageHeader
        title="Coatings"
        lead="Products and formulations under test, with the specs their results are checked against."
      />
      <ListFilters
        label="Filter coatings"
        fields={[
          {
            name: 'q',
            label: 'Search code, name or description',
            type: 'text',
            placeholder: 'HT-200',
          },
          { name: 'includeArchived', label: 'Show archived', type: 'checkbox' },
        ]}
      />
      <CoatingsTable
        rows={list.items}
        total={list.total}
        page={list.page}
        pageSize={list.pageSize}
        sort={query.sort}
        dir={query.dir}
        exportHref={
          can(role, 'results:export')
            ? exportHref('/api/coatings/export.csv', coatingListQuerySchema, query)
            : null
        }
      />
      {can(role, 'catalog:manage') ? (
        <details className="card mt-6">
          <summary className="cursor-pointer font-semibold">Add a coating</summary>
          <div className="mt-3">
            <CoatingForm />
          </div>
        </details>
      ) : null}
    </>
  );
}
