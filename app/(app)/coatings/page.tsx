import type { Metadata } from 'next';
import { CoatingForm, CoatingsTable } from '@/components/records/coatings';
import {
  listQueryFromPage,
  listTableProps,
  type PageSearchParams,
} from '@/components/records/list-query';
import { RecordListPage } from '@/components/records/record-pages';
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
    <RecordListPage
      title="Coatings"
      lead="Products and formulations under test, with the specs their results are checked against."
      filters={{
        label: 'Filter coatings',
        fields: [
          {
            name: 'q',
            label: 'Search code, name or description',
            type: 'text',
            placeholder: 'HT-200',
          },
          { name: 'includeArchived', label: 'Show archived', type: 'checkbox' },
        ],
      }}
      add={can(role, 'catalog:manage') ? { summary: 'Add a coating', form: <CoatingForm /> } : null}
    >
      <CoatingsTable
        {...listTableProps(list, query, {
          path: '/api/coatings/export.csv',
          schema: coatingListQuerySchema,
          allowed: can(role, 'results:export'),
        })}
      />
    </RecordListPage>
  );
}
