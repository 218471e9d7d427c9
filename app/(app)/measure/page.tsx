import type { Metadata } from 'next';
import { MeasureWorkspace } from '@/components/measure/workspace';
import { PageHeader } from '@/components/ui/empty-state';
import type { FitMethod } from '@/lib/analysis/types';
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
  // ?photos=a,b opens photos (saved or not), e.g. a drop from its page or after a reload.
  const workspace = await loadMeasureWorkspace(ctx, (photos ?? '').split(',').filter(Boolean));
  return (
    <>
      <PageHeader
        title="Measure"
        lead="Upload droplet photos, check each fitted profile and baseline in the table and on the canvas, put them on their samples and save the left and right angles."
      />
      <MeasureWorkspace
        samples={workspace.samples}
        liquids={workspace.liquids}
        initialPhotos={workspace.photos.map((p) => ({
          ...p,
          saved: p.saved ? { ...p.saved, method: p.saved.method as FitMethod } : null,
        }))}
        initialSampleId={workspace.samples.some((s) => s.id === sample) ? (sample ?? null) : null}
        initialSession={workspace.session}
        operatorName={ctx.user.name}
      />
    </>
  );
}
