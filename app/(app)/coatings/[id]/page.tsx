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
  listTableProps,
  type RecordPageProps,
} from '@/components/records/list-query';
import { RecordPageHeader, RecordSection } from '@/components/records/record-pages';
import { SpecsPanel } from '@/components/records/specs';
import { requirePage } from '@/lib/auth/guard';
import { loadCoatingPage } from '@/server/records/detail-pages';
import { can } from '@/lib/auth/permissions';
import { batchListQuerySchema } from '@/lib/contracts/batches';
import { specListQuerySchema } from '@/lib/contracts/specs';

export const metadata: Metadata = { title: 'Coating' };

export default async function Page({ params, searchParams }: RecordPageProps) {
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
      <RecordPageHeader
        back={{ href: '/coatings', label: 'Coatings' }}
        title={`${coating.code} · ${coating.name}`}
        lead={coating.description || undefined}
        archived={Boolean(coating.archivedAt)}
        what="coating"
        actions={
          watching !== null ? (
            <div className="-mt-3 mb-4">
              <WatchCoatingButton coatingId={id} initiallyWatching={watching} />
            </div>
          ) : null
        }
      />

      <RecordSection id="specs" title="Specs">
        <SpecsPanel
          coatingId={id}
          specs={specs.items}
          liquids={liquids.map((l) => ({ value: l.id, label: l.name }))}
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
