import type { Metadata } from 'next';
import {
  exportHref,
  listQueryFromPage,
  type PageSearchParams,
} from '@/components/records/list-query';
import { SessionsTable } from '@/components/records/sessions';
import { PageHeader } from '@/components/ui/empty-state';
import { ListFilters } from '@/components/ui/list-filters';
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
    <>
      <PageHeader
        title="Measurement sessions"
        lead="Sittings at the instrument: who measured, when, with which liquid, room conditions, drop volume and camera scale."
      />
      <ListFilters
        label="Filter sessions"
        fields={[
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
        ]}
      />
      <SessionsTable
        rows={list.items}
        total={list.total}
        page={list.page}
        pageSize={list.pageSize}
        sort={query.sort}
        dir={query.dir}
        exportHref={
          can(ctx.organization.role, 'results:export')
            ? exportHref(
                '/api/measurement-sessions/export.csv',
                measurementSessionListQuerySchema,
                query,
              )
            : null
        }
      />
    </>
  );
}
