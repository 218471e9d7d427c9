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
} from '@/db/queries/surface-energy';
import { HttpError } from '@/lib/api/errors';
import { requirePage } from '@/lib/auth/guard';
import { can } from '@/lib/auth/permissions';
import { computeSurfaceEnergy, methodAvailability } from '@/lib/validation/surface-energy';

export const metadata: Metadata = { title: 'Surface energy' };

async function subjectOrNull(
  organizationId: string,
  sampleId: string,
): Promise<SubjectSummary | null> {
  try {
    return await getSurfaceEnergySubject(organizationId, { sampleId });
  } catch (error) {
    if (error instanceof HttpError && error.status === 404) return null;
    throw error;
  }
}

export default async function SurfaceEnergyPage({
  searchParams,
}: {
  searchParams: Promise<{ sample?: string }>;
}) {
  const ctx = await requirePage('organization:read');
  const organizationId = ctx.organization.id;
  const { sample: sampleId } = await searchParams;
  const choices = await listSurfaceEnergyChoices(organizationId);
  const subject = sampleId ? await subjectOrNull(organizationId, sampleId) : null;
  const readAll = can(ctx.organization.role, 'results:read-all');

  let body: React.ReactNode;
  if (choices.length === 0) {
    body = (
      <EmptyState title="No samples yet">
        Surface free energy is computed for a sample. Add a coating, a batch and a sample, then
        measure the contact angles of at least two probe liquids on it.
      </EmptyState>
    );
  } else if (!sampleId) {
    body = (
      <EmptyState title="Choose a sample">
        Pick a coating, a batch and a sample above to see the liquids measured on it and its surface
        free energy.
      </EmptyState>
    );
  } else if (!subject) {
    body = (
      <EmptyState title="Sample not found">
        That sample is not in this organization. Choose another one above.
      </EmptyState>
    );
  } else {
    const [angleTable, saved] = await Promise.all([
      listAngleTable(organizationId, { sampleId: subject.id }, { readAll }),
      listSurfaceEnergyResults(organizationId, { sampleId: subject.id }),
    ]);
    const liquids = angleTableToLiquids(angleTable);
    const options = {
      methods: ['owrk' as const],
      uncertaintyBasis: 'mean' as const,
      envelopeAngleDeg: 0,
    };
    body = (
      <SurfaceEnergyWorkspace
        key={subject.id}
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
        lead="Surface free energy of a sample from the mean contact angles of the probe liquids measured on it, with the uncertainty propagated from the angles’ spread."
      />
      <SamplePicker choices={choices} selectedSampleId={subject?.id ?? null} />
      <div className="mt-6">{body}</div>
    </>
  );
}
