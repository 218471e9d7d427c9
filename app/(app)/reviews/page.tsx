import type { Metadata } from 'next';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';

export const metadata: Metadata = { title: 'Reviews' };

export default async function Page() {
  await requirePage('organization:read');
  return (
    <>
      <PageHeader title="Reviews" lead="Results waiting for approval, and the ones already signed off." />
      <EmptyState title="Nothing to review">No results have been submitted for review.</EmptyState>
    </>
  );
}
