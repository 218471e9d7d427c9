import type { Metadata } from 'next';
import { SamplePicker } from '@/components/surface-energy/sample-picker';
import { SurfaceEnergyWorkspace } from '@/components/surface-energy/workspace';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import {
  angleTableToLiquids,
  getSurfaceEnergySubject,
  listAngleTable,
  listSurfaceEnergyChoices,
  listSurfaceEnergyResults,
  type SubjectSummary,
  type SurfaceEnergySubject,
} from '@/db/queries/surface-energy';
import { HttpError } from '@/lib/api/errors';
import { requirePage } from '@/lib/auth/guard';
import { can } from '@/lib/auth/permissions';
import { computeSurfaceEnergy, methodAvailability } from '@/lib/validation/surface-energy';

export const metadata: Metadata = { title: 'Surface energy' };

async function subjectOrNull(
  organizationId: string,
  wanted: SurfaceEnergySubject,
): Promise<SubjectSummary | null> {
  try {
    return await getSurfaceEnergySubject(organizationId, wanted);
  } catch (error) {
    if (error instanceof HttpError && error.status === 404) return null;
    throw error;
  }
}

export default async function SurfaceEnergyPage({
  searchParams,
}: {
  searchParams: Promise<{ sample?: string; batch?: string }>;
}) {
  const ctx = await requirePage('organization:read');
  const organizationId = ctx.organization.id;
  const { sample: sampleId, batch: batchId } = await searchParams;
  // A sample wins over a batch when a link carries both.
  const wanted: SurfaceEnergySubject | null = sampleId
    ? { sampleId }
    : batchId
      ? { batchId }
      : null;
  const choices = await listSurfaceEnergyChoices(organizationId);
  const subject = wanted ? await subjectOrNull(organizationId, wanted) : null;
  const readAll = can(ctx.organization.role, 'results:read-all');

  let body: React.ReactNode;
  if (choices.length === 0) {
    body = (
      <EmptyState title="No samples yet">
        Surface free energy is computed for a sample. Add a coating, a batch and a sample, then
        measure the contact angles of at least two probe liquids on it.
      </EmptyState>
    );
  } else if (!wanted) {
    body = (
      <EmptyState title="Choose a sample">
        Pick a coating, a batch and a sample (or all samples of the batch) above to see the liquids
        measured on it and its surface free energy.
      </EmptyState>
    );
  } else if (!subject) {
    body = (
      <EmptyState title={sampleId ? 'Sample not found' : 'Batch not found'}>
        That {sampleId ? 'sample' : 'batch'} is not in this organization. Choose another one above.
      </EmptyState>
    );
  } else {
    const found: SurfaceEnergySubject =
      subject.kind === 'batch' ? { batchId: subject.id } : { sampleId: subject.id };
    const [angleTable, saved] = await Promise.all([
      listAngleTable(organizationId, found, { readAll }),
      listSurfaceEnergyResults(organizationId, found),
    ]);
    const liquids = angleTableToLiquids(angleTable);
    const options = {
      methods: ['owrk' as const],
      uncertaintyBasis: 'mean' as const,
      envelopeAngleDeg: 0,
    };
    body = (
      <SurfaceEnergyWorkspace
        key={`${subject.kind}:${subject.id}`}
        subject={{ ...subject, treatedAt: subject.treatedAt?.toISOString() ?? null }}
        angleTable={angleTable}
        liquids={liquids}
        availability={methodAvailability(liquids)}
        initialOutputs={angleTable.length > 0 ? computeSurfaceEnergy(liquids, options) : null}
        initialSaved={saved.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }))}
        canSave={can(ctx.organization.role, 'records:write')}
        readAll={readAll}
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
