import type { Metadata } from 'next';
import { TensiometryWorkspace } from '@/components/tensiometry/workspace';
import { PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { can } from '@/lib/auth/permissions';
import { listSavedTensiometry } from '@/server/tensiometry/list';

export const metadata: Metadata = { title: 'Tensiometry' };

export default async function TensiometryPage() {
  const ctx = await requirePage('organization:read');
  const { items: saved } = await listSavedTensiometry(ctx.organization.id, { limit: 30 });
  return (
    <>
      <PageHeader
        title="Tensiometry"
        lead="Surface tension or contact angle from a Wilhelmy plate reading, a check of the probe water against its published surface tension, and surface tension from a photo of a pendant drop."
      />
      <TensiometryWorkspace
        canSave={can(ctx.organization.role, 'records:write')}
        canReadPhotos={can(ctx.organization.role, 'results:read-all')}
        initialSaved={saved.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }))}
      />
    </>
  );
}
