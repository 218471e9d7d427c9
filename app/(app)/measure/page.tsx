import type { Metadata } from 'next';
import { MeasureWorkspace } from '@/components/measure/workspace';
import { PageHeader } from '@/components/ui/empty-state';
import { listProbeLiquidChoices, listSampleChoices } from '@/db/queries/drops';
import { listPhotosByIds, listUnsavedPhotos } from '@/db/queries/photos';
import { requirePage } from '@/lib/auth/guard';

export const metadata: Metadata = { title: 'Measure' };

export default async function MeasurePage({
  searchParams,
}: {
  searchParams: Promise<{ sample?: string; photos?: string }>;
}) {
  const ctx = await requirePage('records:write');
  const { sample, photos } = await searchParams;
  // ?photos=a,b reopens photos (saved or not) in the strip, e.g. after a reload.
  const requested = (photos ?? '').split(',').filter(Boolean).slice(0, 50);
  const [samples, liquids, unsaved, reopened] = await Promise.all([
    listSampleChoices(ctx.organization.id),
    listProbeLiquidChoices(ctx.organization.id),
    listUnsavedPhotos(ctx.organization.id, ctx.user.id),
    listPhotosByIds(ctx.organization.id, requested),
  ]);
  const strip = [...reopened, ...unsaved.filter((p) => !requested.includes(p.id))];
  return (
    <>
      <PageHeader
        title="Measure"
        lead="Upload droplet photos, check the fitted profile and the baseline, drag the baseline where your eye disagrees, and save the left and right angles to a sample."
      />
      <MeasureWorkspace
        samples={samples}
        liquids={liquids}
        initialPhotos={strip.map((p) => ({ id: p.id, name: p.originalName, width: p.width, height: p.height }))}
        initialSampleId={samples.some((s) => s.id === sample) ? (sample ?? null) : null}
        operatorName={ctx.user.name}
      />
    </>
  );
}
