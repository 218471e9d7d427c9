import type { Metadata } from 'next';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';

export const metadata: Metadata = { title: 'Compare' };

export default async function Page() {
  await requirePage('organization:read');
  return (
    <>
      <PageHeader title="Compare" lead="Batches side by side against their specs, with the statistics behind each verdict." />
      <EmptyState title="Nothing to compare yet">Comparisons need batches with measured drops.</EmptyState>
    </>
  );
}
