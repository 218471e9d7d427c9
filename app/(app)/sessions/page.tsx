import type { Metadata } from 'next';
import {
  listQueryFromPage,
  listTableProps,
  type PageSearchParams,
} from '@/components/records/list-query';
import { RecordListPage } from '@/components/records/record-pages';
import { SessionsTable } from '@/components/records/sessions';
import { requirePage } from '@/lib/auth/guard';
import { measurementSessionRecords, probeLiquidRecords } from '@/server/records/kinds';
import { listRecords } from '@/server/records/list';
import { can } from '@/lib/auth/permissions';
import { MAX_PAGE_SIZE } from '@/lib/contracts/common';
import { measurementSessionListQuerySchema } from '@/lib/contracts/measurement-sessions';
import { probeLiquidListQuerySchema } from '@/lib/contracts/probe-liquids';

export const metadata: Metadata = { title: 'Sessions' };

export default async function Page({ searchParams }: { searchParams: Promise<PageSearchParams> }) {
  const ctx = await requirePage('organization:read');
  const query = listQueryFromPage(measurementSessionListQuerySchema, await searchParams);
  const [list, liquids] = await Promise.all([
    listRecords(measurementSessionRecords, ctx.organization.id, query),
    listRecords(
      probeLiquidRecords,
      ctx.organization.id,
      probeLiquidListQuerySchema.parse({ pageSize: MAX_PAGE_SIZE }),
    ),
  ]);
  return (
    <RecordListPage
      title="Measurement sessions"
      lead="Sittings at the instrument: who measured, when, with which liquid, room conditions, drop volume and camera scale."
      filters={{
        label: 'Filter sessions',
        fields: [
          { name: 'q', label: 'Operator or notes', type: 'text' },
          {
            name: 'probeLiquidId',
            label: 'Probe liquid',
            type: 'select',
            all: 'Any liquid',
            options: liquids.items.map((l) => ({ value: l.id, label: l.name })),
          },
          { name: 'measuredFrom', label: 'From', type: 'date' },
          { name: 'measuredTo', label: 'To', type: 'date' },
        ],
      }}
    >
      <SessionsTable
        {...listTableProps(list, query, {
          path: '/api/measurement-sessions/export.csv',
          schema: measurementSessionListQuerySchema,
          allowed: can(ctx.organization.role, 'results:export'),
        })}
      />
    </RecordListPage>
  );
}
