import type { Metadata } from 'next';
import { VerifyEmailBanner } from '@/components/account/verify-email-banner';
import { OutOfSpec, PendingReviews, RecentDrops } from '@/components/dashboard/sections';
import { PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { ROLE_LABELS } from '@/lib/auth/permissions';
import { loadDashboard } from '@/server/dashboard/load';

export const metadata: Metadata = { title: 'Dashboard' };

export default async function DashboardPage() {
  const ctx = await requirePage('organization:read');
  const { emailVerified, approvedOnly, drops, outOfSpec, pending } = await loadDashboard(ctx);
  return (
    <>
      {emailVerified ? null : <VerifyEmailBanner email={ctx.user.email} />}
      <PageHeader
        title={ctx.organization.name}
        lead={`Signed in as ${ctx.user.name} (${ROLE_LABELS[ctx.organization.role].name}). ${ROLE_LABELS[ctx.organization.role].summary}.`}
      />
      <div className="grid gap-4 lg:grid-cols-3">
        <PendingReviews pending={pending} />
        <RecentDrops drops={drops} approvedOnly={approvedOnly} />
        <OutOfSpec batches={outOfSpec} />
      </div>
    </>
  );
}
