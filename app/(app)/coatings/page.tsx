import type { Metadata } from 'next';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';

export const metadata: Metadata = { title: 'Coatings' };

export default async function Page() {
  await requirePage('organization:read');
  return (
    <>
      <PageHeader title="Coatings" lead="Products and formulations under test, with the specs their results are checked against." />
      <EmptyState title="No coatings yet">Coatings and their specs will be listed here once they are added.</EmptyState>
    </>
  );
}
