import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { ArchiveButton } from '@/components/records/archive-button';
import { BatchForm } from '@/components/records/batches';
import {
  exportHref,
  listQueryFromPage,
  type PageSearchParams,
} from '@/components/records/list-query';
import { BatchDropsTable, SamplesPanel } from '@/components/records/samples';
import { PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { loadBatchPage } from '@/server/records/detail-pages';
import { can } from '@/lib/auth/permissions';
import { PROCESS_PARAMETERS, type ProcessParameterKey } from '@/lib/contracts/batches';
import { sampleListQuerySchema } from '@/lib/contracts/samples';

export const metadata: Metadata = { title: 'Batch' };

export default async function Page({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<PageSearchParams>;
}) {
  const ctx = await requirePage('organization:read');
  const { id } = await params;
  const sampleQuery = {
    ...listQueryFromPage(sampleListQuerySchema, await searchParams, 's'),
    batchId: id,
  };
  const loaded = await loadBatchPage(ctx, id, sampleQuery);
  if (!loaded) notFound();
  const { batch, canWrite, coating, samples, drops, coatings } = loaded;
  const role = ctx.organization.role;
  const parameters = (Object.keys(PROCESS_PARAMETERS) as ProcessParameterKey[]).filter(
    (key) => batch.process[key] !== undefined,
  );
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/batches" className="text-lagoon-700 hover:underline">
          ← Batches
        </Link>
      </p>
      <PageHeader title={`Batch ${batch.lotCode}`} />
      <p className="-mt-3 mb-4 flex flex-wrap gap-3 text-sm">
        <a href={`/api/batches/${id}/report`} className="btn-quiet py-1">
          Certificate of analysis (PDF)
        </a>
        <Link href={`/compare?coating=${coating.code}&batches=${batch.lotCode}`} className="btn-quiet py-1">
          Compare with other batches
        </Link>
      </p>
      {batch.archivedAt ? (
        <p className="mb-4 rounded-md border border-amber-500 bg-amber-50 px-3 py-2 text-sm text-amber-900">
          This batch is archived: its records are kept, but it can no longer be changed.
        </p>
      ) : null}
      <section className="card mb-8" aria-label="Batch details">
        <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[auto_1fr]">
          <dt className="text-ink-600">Coating</dt>
          <dd>
            <Link href={`/coatings/${coating.id}`} className="text-lagoon-700 hover:underline">
              {coating.code} · {coating.name}
            </Link>
          </dd>
          <dt className="text-ink-600">Produced on</dt>
          <dd>{batch.producedOn}</dd>
          {parameters.length === 0 ? (
            <>
              <dt className="text-ink-600">Process parameters</dt>
              <dd>None recorded</dd>
            </>
          ) : (
            parameters.map((key) => (
              <div key={key} className="contents">
                <dt className="text-ink-600">
                  {PROCESS_PARAMETERS[key].label} ({PROCESS_PARAMETERS[key].unit})
                </dt>
                <dd>{batch.process[key]}</dd>
              </div>
            ))
          )}
          <dt className="text-ink-600">Notes</dt>
          <dd className="whitespace-pre-wrap">{batch.notes || '—'}</dd>
        </dl>
      </section>

      <section className="mb-8" aria-labelledby="samples-heading">
        <div className="mb-2 flex items-center justify-between">
          <h2 id="samples-heading">Samples</h2>
          {canWrite ? (
            <Link className="btn-quiet py-1" href={`/batches/${id}/import`}>
              Import angles from CSV
            </Link>
          ) : null}
        </div>
        <SamplesPanel
          batchId={id}
          canWrite={canWrite}
          rows={samples.items}
          total={samples.total}
          page={samples.page}
          pageSize={samples.pageSize}
          sort={sampleQuery.sort}
          dir={sampleQuery.dir}
          exportHref={
            can(role, 'results:export')
              ? exportHref('/api/samples/export.csv', sampleListQuerySchema, sampleQuery)
              : null
          }
        />
      </section>

      <section className="mb-8" aria-labelledby="drops-heading">
        <h2 id="drops-heading" className="mb-2">
          Drops
        </h2>
        <BatchDropsTable drops={drops} />
      </section>

      {canWrite ? (
        <section className="card" aria-labelledby="edit-batch-heading">
          <div className="mb-3 flex items-center justify-between">
            <h2 id="edit-batch-heading">Edit batch</h2>
            <ArchiveButton
              url={`/api/batches/${id}`}
              version={batch.version}
              what="batch"
              afterDeleteHref="/batches"
            />
          </div>
          <BatchForm
            batch={batch}
            coatings={coatings.map((c) => ({ value: c.id, label: `${c.code} · ${c.name}` }))}
          />
        </section>
      ) : null}
    </>
  );
}
