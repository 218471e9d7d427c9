import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { ImportForm } from '@/components/records/import-form';
import { PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { findRecordOf } from '@/server/records/get';
import { batchRecords } from '@/server/records/kinds';
import { IMPORT_COLUMNS } from '@/lib/contracts/import';

export const metadata: Metadata = { title: 'Import angles' };

export default async function Page({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePage('records:write');
  const { id } = await params;
  const batch = await findRecordOf(batchRecords, ctx.organization.id, id);
  if (!batch) notFound();
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/batches/${id}`} className="text-lagoon-700 hover:underline">
          ← Batch {batch.lotCode}
        </Link>
      </p>
      <PageHeader
        title={`Import angles into batch ${batch.lotCode}`}
        lead="Contact angles read by hand (legacy records). Every row is checked; nothing is imported unless all rows are valid. Each row becomes a drop with a manual analysis."
      />
      <section className="card mb-6 text-sm" aria-label="Columns">
        <h2 className="mb-2 text-base">Columns</h2>
        <ul className="list-disc space-y-1 pl-5">
          <li>
            <strong>{IMPORT_COLUMNS.sample.header}</strong>: a sample of this batch (add it on the
            batch page first).
          </li>
          <li>
            <strong>{IMPORT_COLUMNS.probeLiquid.header}</strong>: a name or id from the Probe
            liquids page, like Water.
          </li>
          <li>
            <strong>{IMPORT_COLUMNS.leftDeg.header}</strong>,{' '}
            <strong>{IMPORT_COLUMNS.rightDeg.header}</strong>: degrees, 0 to 180, decimal point.
          </li>
          <li>
            <strong>{IMPORT_COLUMNS.measuredAt.header}</strong>: YYYY-MM-DD or YYYY-MM-DD HH:MM (UTC
            unless an offset is given).
          </li>
          <li>
            <strong>{IMPORT_COLUMNS.operator.header}</strong>,{' '}
            <strong>{IMPORT_COLUMNS.note.header}</strong>: optional.
          </li>
        </ul>
      </section>
      {batch.archivedAt ? (
        <p className="rounded-md border border-amber-500 bg-amber-50 px-3 py-2 text-sm text-amber-900">
          This batch is archived; results can no longer be added to it.
        </p>
      ) : (
        <ImportForm batchId={id} lotCode={batch.lotCode} />
      )}
    </>
  );
}
