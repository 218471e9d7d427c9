import type { Metadata } from 'next';
import { MeasureWorkspace } from '@/components/measure/workspace';
import { PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { loadMeasureWorkspace } from '@/server/drops/workspace';

export const metadata: Metadata = { title: 'Measure' };

export default async function MeasurePage({
  searchParams,
}: {
  searchParams: Promise<{ sample?: string; photos?: string }>;
}) {
  const ctx = await requirePage('records:write');
  const { sample, photos } = await searchParams;
  // ?photos=a,b reopens photos (saved or not) in the strip, e.g. after a reload.
  const { samples, liquids, photos: strip } = await loadMeasureWorkspace(
    ctx,
    (photos ?? '').split(',').filter(Boolean),
  );
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
