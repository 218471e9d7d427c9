import type { Metadata } from 'next';
import { VerifyEmailBanner } from '@/components/account/verify-email-banner';
import { OutOfSpec, PendingReviews, RecentDrops } from '@/components/dashboard/sections';
import { PageHeader } from '@/components/ui/empty-state';
import { emailVerifiedAt } from '@/db/queries/account-tokens';
import { outOfSpecBatches, pendingReviewCount, recentDrops } from '@/db/queries/dashboard';
import { requirePage } from '@/lib/auth/guard';
import { can, ROLE_LABELS } from '@/lib/auth/permissions';

export const metadata: Metadata = { title: 'Dashboard' };

export default async function DashboardPage() {
  const ctx = await requirePage('organization:read');
  const orgId = ctx.organization.id;
  const approvedOnly = !can(ctx.organization.role, 'results:read-all');
  const [verified, drops, outOfSpec, pending] = await Promise.all([
    emailVerifiedAt(ctx.user.id),
    recentDrops(orgId, { approvedOnly }),
    outOfSpecBatches(orgId, { approvedOnly }),
    approvedOnly ? Promise.resolve(null) : pendingReviewCount(orgId),
  ]);
  return (
    <>
      {verified ? null : <VerifyEmailBanner email={ctx.user.email} />}
      <PageHeader
        title={ctx.organization.name}
        lead={`Signed in as ${ctx.user.name} (${ROLE_LABELS[ctx.organization.role].name}). ${ROLE_LABELS[ctx.organization.role].summary}.`}
      />
      <div className="grid gap-4 lg:grid-cols-3">
        <RecentDrops drops={drops} approvedOnly={approvedOnly} />
        <PendingReviews count={pending} />
        <OutOfSpec batches={outOfSpec} />
      </div>
    </>
  );
}
