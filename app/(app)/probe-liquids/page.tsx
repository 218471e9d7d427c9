import type { Metadata } from 'next';
import {
  listQueryFromPage,
  listTableProps,
  type PageSearchParams,
} from '@/components/records/list-query';
import { ProbeLiquidsPanel } from '@/components/records/probe-liquids';
import { RecordListPage } from '@/components/records/record-pages';
import { requirePage } from '@/lib/auth/guard';
import { probeLiquidRecords } from '@/server/records/kinds';
import { listRecords } from '@/server/records/list';
import { can } from '@/lib/auth/permissions';
import { probeLiquidListQuerySchema } from '@/lib/contracts/probe-liquids';

export const metadata: Metadata = { title: 'Probe liquids' };

export default async function Page({ searchParams }: { searchParams: Promise<PageSearchParams> }) {
  const ctx = await requirePage('organization:read');
  const query = listQueryFromPage(probeLiquidListQuerySchema, await searchParams);
  const list = await listRecords(probeLiquidRecords, ctx.organization.id, query);
  const role = ctx.organization.role;
  return (
    <RecordListPage
      title="Probe liquids"
      lead="Surface tension and its components, in mN/m, for each test liquid. The built-in library carries published values with their sources; add your own liquids with yours."
      filters={{
        label: 'Filter probe liquids',
        fields: [
          { name: 'q', label: 'Name', type: 'text', placeholder: 'Water' },
          {
            name: 'origin',
            label: 'Origin',
            type: 'select',
            all: 'Library and own',
            options: [
              { value: 'built-in', label: 'Built-in library' },
              { value: 'own', label: 'Your organization' },
            ],
          },
          { name: 'includeArchived', label: 'Show archived', type: 'checkbox' },
        ],
      }}
    >
      <ProbeLiquidsPanel
        canManage={can(role, 'catalog:manage')}
        {...listTableProps(list, query, {
          path: '/api/probe-liquids/export.csv',
          schema: probeLiquidListQuerySchema,
          allowed: can(role, 'results:export'),
        })}
      />
    </RecordListPage>
  );
}
