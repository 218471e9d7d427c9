import type { Metadata } from 'next';
import { DynamicWorkspace } from '@/components/dynamic/workspace';
import { PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { loadDynamicWorkspace } from '@/server/dynamic/workspace';

export const metadata: Metadata = { title: 'Dynamic wetting' };

export default async function DynamicWettingPage() {
  const ctx = await requirePage('records:write');
  const { samples, liquids } = await loadDynamicWorkspace(ctx);
  return (
    <>
      <PageHeader
        title="Dynamic wetting"
        lead="Analyse a series of one drop — a video, frame images or the live camera — frame by frame: advancing and receding angles and hysteresis, the tilting plate's roll-off, or the angle over time. Then save it to a sample."
      />
      <DynamicWorkspace samples={samples} liquids={liquids} />
    </>
  );
}
