import type { Metadata } from 'next';
import { PageHeader } from '@/components/ui/empty-state';
import { RenameOrganizationForm } from '@/components/team/rename-organization-form';
import { listMembers } from '@/db/queries/organizations';
import { requirePage } from '@/lib/auth/guard';
import { ROLE_LABELS } from '@/lib/auth/permissions';

export const metadata: Metadata = { title: 'Team' };

export default async function TeamPage() {
  const ctx = await requirePage('team:manage');
  const members = await listMembers(ctx.organization.id);
  return (
    <>
      <PageHeader title="Team" lead="Who belongs to this organization and what each role may do." />
      <section className="card mb-6">
        <h2 className="mb-3">Members</h2>
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-ink-200 text-xs uppercase tracking-wide text-ink-500">
              <tr>
                <th scope="col" className="py-2 pr-4 font-medium">Name</th>
                <th scope="col" className="py-2 pr-4 font-medium">E-mail</th>
                <th scope="col" className="py-2 pr-4 font-medium">Role</th>
              </tr>
            </thead>
            <tbody>
              {members.map((member) => (
                <tr key={member.userId} className="border-b border-ink-100 last:border-0">
                  <td className="py-2 pr-4 font-medium text-ink-900">{member.name}</td>
                  <td className="py-2 pr-4 text-ink-700">{member.email}</td>
                  <td className="py-2 pr-4">
                    <span title={ROLE_LABELS[member.role].summary}>{ROLE_LABELS[member.role].name}</span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
      <section className="card max-w-lg">
        <h2 className="mb-3">Organization name</h2>
        <RenameOrganizationForm currentName={ctx.organization.name} />
      </section>
    </>
  );
}
