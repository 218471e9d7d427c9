import type { Metadata } from 'next';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { ROLE_LABELS } from '@/lib/auth/permissions';

export const metadata: Metadata = { title: 'Dashboard' };

export default async function DashboardPage() {
  const ctx = await requirePage('organization:read');
  return (
    <>
      <PageHeader
        title={ctx.organization.name}
        lead={`Signed in as ${ctx.user.name} (${ROLE_LABELS[ctx.organization.role].name}). ${ROLE_LABELS[ctx.organization.role].summary}.`}
      />
      <div className="grid gap-4 lg:grid-cols-3">
        <EmptyState title="Recent drops">No drop photos have been measured in this organization yet.</EmptyState>
        <EmptyState title="Batches out of spec">No batch has results to check against a spec yet.</EmptyState>
        <EmptyState title="Pending reviews">Nothing is waiting for review.</EmptyState>
      </div>
    </>
  );
}
