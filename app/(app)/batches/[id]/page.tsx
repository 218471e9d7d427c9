import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { ArchiveButton } from '@/components/records/archive-button';
import { BatchForm } from '@/components/records/batches';
import {
  listQueryFromPage,
  listTableProps,
  type RecordPageProps,
} from '@/components/records/list-query';
import { RecordPageHeader, RecordSection } from '@/components/records/record-pages';
import { BatchDropsTable, SamplesPanel } from '@/components/records/samples';
import { DefinitionList } from '@/components/ui/definition-list';
import { requirePage } from '@/lib/auth/guard';
import { loadBatchPage } from '@/server/records/detail-pages';
import { can } from '@/lib/auth/permissions';
import { PROCESS_PARAMETERS, type ProcessParameterKey } from '@/lib/contracts/batches';
import { sampleListQuerySchema } from '@/lib/contracts/samples';

export const metadata: Metadata = { title: 'Batch' };

export default async function Page({ params, searchParams }: RecordPageProps) {
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
      <RecordPageHeader
        back={{ href: '/batches', label: 'Batches' }}
        title={`Batch ${batch.lotCode}`}
        archived={Boolean(batch.archivedAt)}
        what="batch"
        actions={
          <p className="-mt-3 mb-4 flex flex-wrap gap-3 text-sm">
            <a href={`/api/batches/${id}/report`} className="btn-quiet py-1">
              Certificate of analysis (PDF)
            </a>
            <Link
              href={`/compare?coating=${coating.code}&batches=${batch.lotCode}`}
              className="btn-quiet py-1"
            >
              Compare with other batches
            </Link>
          </p>
        }
      />
      <section className="card mb-8" aria-label="Batch details">
        <DefinitionList
          variant="columns"
          className="gap-x-6 gap-y-2 text-sm"
          items={[
            {
              term: 'Coating',
              value: (
                <Link href={`/coatings/${coating.id}`} className="text-lagoon-700 hover:underline">
                  {coating.code} · {coating.name}
                </Link>
              ),
            },
            { term: 'Produced on', value: batch.producedOn },
            ...(parameters.length === 0
              ? [{ term: 'Process parameters', value: 'None recorded' }]
              : parameters.map((key) => ({
                  term: `${PROCESS_PARAMETERS[key].label} (${PROCESS_PARAMETERS[key].unit})`,
                  value: batch.process[key],
                }))),
            {
              term: 'Notes',
              value: <span className="whitespace-pre-wrap">{batch.notes || '—'}</span>,
            },
          ]}
        />
      </section>

      <RecordSection
        id="samples"
        title="Samples"
        action={
          canWrite ? (
            <Link className="btn-quiet py-1" href={`/batches/${id}/import`}>
              Import angles from CSV
            </Link>
          ) : null
        }
      >
        <SamplesPanel
          batchId={id}
          canWrite={canWrite}
          {...listTableProps(samples, sampleQuery, {
            path: '/api/samples/export.csv',
            schema: sampleListQuerySchema,
            allowed: can(role, 'results:export'),
          })}
        />
      </RecordSection>

      <RecordSection id="drops" title="Drops">
        <BatchDropsTable drops={drops} />
      </RecordSection>

      {canWrite ? (
        <RecordSection
          id="edit-batch"
          title="Edit batch"
          card
          action={
            <ArchiveButton
              url={`/api/batches/${id}`}
              version={batch.version}
              what="batch"
              afterDeleteHref="/batches"
            />
          }
        >
          <BatchForm
            batch={batch}
            coatings={coatings.map((c) => ({ value: c.id, label: `${c.code} · ${c.name}` }))}
          />
        </RecordSection>
      ) : null}
    </>
  );
}
