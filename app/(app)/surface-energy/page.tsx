import type { Metadata } from 'next';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';

export const metadata: Metadata = { title: 'Surface energy' };

export default async function Page() {
  await requirePage('organization:read');
  return (
    <>
      <PageHeader title="Surface energy" lead="Surface free energy of a sample from the angles of two or more probe liquids." />
      <EmptyState title="No surface energy results yet">Surface free energy needs angles of at least two probe liquids on one sample.</EmptyState>
    </>
  );
}
