import type { Metadata } from 'next';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';

export const metadata: Metadata = { title: 'Measure' };

export default async function Page() {
  await requirePage('records:write');
  return (
    <>
      <PageHeader title="Measure" lead="Upload droplet photos, check the fitted profile and baseline, and save left and right angles to a sample." />
      <EmptyState title="Nothing to measure yet">The measurement workspace is not available in this version yet.</EmptyState>
    </>
  );
}
