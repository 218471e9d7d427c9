import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { WatchCoatingButton } from '@/components/alerts/watch-button';
import { ArchiveButton } from '@/components/records/archive-button';
import { BatchesTable } from '@/components/records/batches';
import { CoatingForm } from '@/components/records/coatings';
import {
  exportHref,
  listQueryFromPage,
  type PageSearchParams,
} from '@/components/records/list-query';
import { SpecsPanel } from '@/components/records/specs';
import { PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { loadCoatingPage } from '@/server/records/detail-pages';
import { can } from '@/lib/auth/permissions';
import { batchListQuerySchema } from '@/lib/contracts/batches';
import { specListQuerySchema } from '@/lib/contracts/specs';

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
  const batchQuery = {
    ...listQueryFromPage(batchListQuerySchema, await searchParams),
    coatingId: id,
  };
  const loaded = await loadCoatingPage(ctx, id, batchQuery);
  if (!loaded) notFound();
  const { coating, canManage, specs, specQuery, batches, liquids, watching } = loaded;
  const role = ctx.organization.role;
  const canExport = can(role, 'results:export');
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/coatings" className="text-lagoon-700 hover:underline">
          ← Coatings
        </Link>
      </p>
      <PageHeader
        title={`${coating.code} · ${coating.name}`}
        lead={coating.description || undefined}
      />
      {watching !== null ? (
        <div className="-mt-3 mb-4">
          <WatchCoatingButton coatingId={id} initiallyWatching={watching} />
        </div>
      ) : null}
      {coating.archivedAt ? (
        <p className="mb-4 rounded-md border border-amber-500 bg-amber-50 px-3 py-2 text-sm text-amber-900">
          This coating is archived: its records are kept, but it can no longer be changed.
        </p>
      ) : null}

      <section className="mb-8" aria-labelledby="specs-heading">
        <h2 id="specs-heading" className="mb-2">
          Specs
        </h2>
        <SpecsPanel
          coatingId={id}
          specs={specs.items}
          liquids={liquids.map((l) => ({ value: l.id, label: l.name }))}
          canManage={canManage}
          exportHref={
            canExport ? exportHref('/api/specs/export.csv', specListQuerySchema, specQuery) : null
          }
        />
      </section>

      <section className="mb-8" aria-labelledby="batches-heading">
        <div className="mb-2 flex items-center justify-between">
          <h2 id="batches-heading">Batches</h2>
          {can(role, 'records:write') && !coating.archivedAt ? (
            <Link className="btn-quiet py-1" href={`/batches?coatingId=${id}#new-batch`}>
              Add a batch of this coating
            </Link>
          ) : null}
        </div>
        <BatchesTable
          rows={batches.items}
          total={batches.total}
          page={batches.page}
          pageSize={batches.pageSize}
          sort={batchQuery.sort}
          dir={batchQuery.dir}
          exportHref={
            canExport
              ? exportHref('/api/batches/export.csv', batchListQuerySchema, batchQuery)
              : null
          }
          emptyText="No batches of this coating have been recorded yet."
        />
      </section>

      {canManage ? (
        <section className="card" aria-labelledby="edit-coating-heading">
          <div className="mb-3 flex items-center justify-between">
            <h2 id="edit-coating-heading">Edit coating</h2>
            <ArchiveButton
              url={`/api/coatings/${id}`}
              version={coating.version}
              what="coating"
              afterDeleteHref="/coatings"
            />
          </div>
          <CoatingForm coating={coating} />
        </section>
      ) : null}
    </>
  );
}
