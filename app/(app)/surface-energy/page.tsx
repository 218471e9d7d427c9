import type { Metadata } from 'next';
import { SamplePicker } from '@/components/surface-energy/sample-picker';
import { SurfaceEnergyWorkspace } from '@/components/surface-energy/workspace';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { loadSurfaceEnergyPage } from '@/server/surface-energy/read';

export const metadata: Metadata = { title: 'Surface energy' };

export default async function SurfaceEnergyPage({
  searchParams,
}: {
  searchParams: Promise<{ sample?: string; batch?: string }>;
}) {
  const ctx = await requirePage('organization:read');
  const { sample: sampleId, batch: batchId } = await searchParams;
  const { choices, asked, evaluation, saved, canSave } = await loadSurfaceEnergyPage(ctx, {
    sampleId,
    batchId,
  });
  const subject = evaluation?.subject ?? null;

  let body: React.ReactNode;
  if (choices.length === 0) {
    body = (
      <EmptyState title="No samples yet">
        Surface free energy is computed for a sample. Add a coating, a batch and a sample, then
        measure the contact angles of at least two probe liquids on it.
      </EmptyState>
    );
  } else if (!asked) {
    body = (
      <EmptyState title="Choose a sample">
        Pick a coating, a batch and a sample (or all samples of the batch) above to see the liquids
        measured on it and its surface free energy.
      </EmptyState>
    );
  } else if (!evaluation || !subject) {
    body = (
      <EmptyState title={asked === 'sample' ? 'Sample not found' : 'Batch not found'}>
        That {asked} is not in this organization. Choose another one above.
      </EmptyState>
    );
  } else {
    body = (
      <SurfaceEnergyWorkspace
        key={`${subject.kind}:${subject.id}`}
        subject={{ ...subject, treatedAt: subject.treatedAt?.toISOString() ?? null }}
        angleTable={evaluation.angleTable}
        liquids={evaluation.liquids}
        specWindows={evaluation.specWindows}
        availability={evaluation.availability}
        initialOutputs={evaluation.angleTable.length > 0 ? evaluation.outputs : null}
        initialSaved={saved.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }))}
        canSave={canSave}
        readAll={evaluation.readAll}
      />
    );
  }

  return (
    <>
      <PageHeader
        title="Surface energy"
        lead="Surface free energy of a sample, or of a whole batch, from the mean contact angles of the probe liquids measured on it, with the uncertainty propagated from the angles’ spread."
      />
      <SamplePicker
        choices={choices}
        selectedSampleId={subject?.kind === 'sample' ? subject.id : null}
        selectedBatchId={subject?.kind === 'batch' ? subject.id : null}
      />
      <div className="mt-6">{body}</div>
    </>
  );
}
