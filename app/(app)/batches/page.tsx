import type { Metadata } from 'next';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';

export const metadata: Metadata = { title: 'Batches' };

export default async function Page() {
  await requirePage('organization:read');
  return (
    <>
      <PageHeader title="Batches" lead="Production and trial lots, their process parameters and samples." />
      <EmptyState title="No batches yet">Batches will be listed here once they are recorded.</EmptyState>
    </>
  );
}
