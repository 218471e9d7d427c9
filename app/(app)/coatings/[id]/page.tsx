import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { WatchCoatingButton } from '@/components/alerts/watch-button';
import { isWatching } from '@/db/queries/alerts';
import { listBatches } from '@/db/queries/batches';
import { getCoating } from '@/db/queries/coatings';
import { listProbeLiquids } from '@/db/queries/probe-liquids';
import { listSpecs } from '@/db/queries/specs';
import { ArchiveButton } from '@/components/records/archive-button';
import { BatchesTable } from '@/components/records/batches';
import { CoatingForm } from '@/components/records/coatings';
import {
  exportHref,
  listQueryFromPage,
  listTableProps,
  type PageSearchParams,
} from '@/components/records/list-query';
import { RecordPageHeader, RecordSection } from '@/components/records/record-pages';
import { SpecsPanel } from '@/components/records/specs';
import { HttpError } from '@/lib/api/errors';
import { requirePage } from '@/lib/auth/guard';
import { can } from '@/lib/auth/permissions';
import { MAX_PAGE_SIZE, batchListQuerySchema, specListQuerySchema } from '@/lib/validation/records';

export const metadata: Metadata = { title: 'Coating' };

export default async function Page({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<PageSearchParams>;
}) {
  const ctx = await requirePage('organization:read');
  const { id } = await params;
  const organizationId = ctx.organization.id;
  const coating = await getCoating(organizationId, id).catch((error) => {
    if (error instanceof HttpError && error.status === 404) notFound();
    throw error;
  });
  const role = ctx.organization.role;
  const canManage = can(role, 'catalog:manage') && !coating.archivedAt;
  const canExport = can(role, 'results:export');
  const batchQuery = {
    ...listQueryFromPage(batchListQuerySchema, await searchParams),
    coatingId: id,
  };
  const specQuery = specListQuerySchema.parse({ coatingId: id, pageSize: MAX_PAGE_SIZE });
  const [specs, batches, liquids] = await Promise.all([
    listSpecs(organizationId, specQuery),
    listBatches(organizationId, batchQuery),
    canManage
      ? listProbeLiquids(organizationId, {
          origin: 'all',
          includeArchived: false,
          sort: 'name',
          dir: 'asc',
          page: 1,
          pageSize: MAX_PAGE_SIZE,
        })
      : Promise.resolve({ items: [] }),
  ]);
  return (
    <>
      <RecordPageHeader
        back={{ href: '/coatings', label: 'Coatings' }}
        title={`${coating.code} · ${coating.name}`}
        lead={coating.description || undefined}
        archived={Boolean(coating.archivedAt)}
        what="coating"
        actions={
          can(role, 'results:read-all') ? (
            <div className="-mt-3 mb-4">
              <WatchCoatingButton
                coatingId={id}
                initiallyWatching={await isWatching(ctx.user.id, id)}
              />
            </div>
          ) : null
        }
      />

      <RecordSection id="specs" title="Specs">
        <SpecsPanel
          coatingId={id}
          specs={specs.items}
          liquids={liquids.items.map((l) => ({ value: l.id, label: l.name }))}
          canManage={canManage}
          exportHref={
            canExport ? exportHref('/api/specs/export.csv', specListQuerySchema, specQuery) : null
          }
        />
      </RecordSection>

      <RecordSection
        id="batches"
        title="Batches"
        action={
          can(role, 'records:write') && !coating.archivedAt ? (
            <Link className="btn-quiet py-1" href={`/batches?coatingId=${id}#new-batch`}>
              Add a batch of this coating
            </Link>
          ) : null
        }
      >
        <BatchesTable
          {...listTableProps(batches, batchQuery, {
            path: '/api/batches/export.csv',
            schema: batchListQuerySchema,
            allowed: canExport,
          })}
          emptyText="No batches of this coating have been recorded yet."
        />
      </RecordSection>

      {canManage ? (
        <RecordSection
          id="edit-coating"
          title="Edit coating"
          card
          action={
            <ArchiveButton
              url={`/api/coatings/${id}`}
              version={coating.version}
              what="coating"
              afterDeleteHref="/coatings"
            />
          }
        >
          <CoatingForm coating={coating} />
        </RecordSection>
      ) : null}
    </>
  );
}
