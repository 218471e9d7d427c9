import type { Metadata } from 'next';
import Link from 'next/link';
import { FormCard, ListCard } from '@/components/ui/cards';
import { PageHeader } from '@/components/ui/empty-state';
import { PlainTable } from '@/components/ui/plain-table';
import { InvitationRow } from '@/components/team/invitation-row';
import { InviteForm } from '@/components/team/invite-form';
import { MemberRow } from '@/components/team/member-row';
import { RenameOrganizationForm } from '@/components/team/rename-organization-form';
import { requirePage } from '@/lib/auth/guard';
import { ROLE_LABELS } from '@/lib/auth/permissions';
import { loadTeam } from '@/server/team/load';

export const metadata: Metadata = { title: 'Team' };

const day = (date: Date) => date.toISOString().slice(0, 10);

export default async function TeamPage() {
  const ctx = await requirePage('team:manage');
  const { members, invitations } = await loadTeam(ctx.organization.id);
  return (
    <>
      <PageHeader title="Team" lead="Who belongs to this organization and what each role may do." />
      <p className="mb-4 text-sm">
        <Link href="/team/api">API access</Link>: tokens for instruments and LIMS.{' '}
        <Link href="/team/webhooks">Webhooks</Link>: signed notices of saved analyses, decided
        reviews and changed batch verdicts.
      </p>
      <section className="card mb-6">
        <h2 className="mb-3">Members</h2>
        <PlainTable head={['Name', 'E-mail', 'Role', { label: 'Actions', hidden: true }]}>
          {members.map((member) => (
            <MemberRow
              key={member.userId}
              userId={member.userId}
              name={member.name}
              email={member.email}
              role={member.role}
              isYou={member.userId === ctx.user.id}
            />
          ))}
        </PlainTable>
        <p className="mt-3 text-xs text-ink-500">
          Every organization keeps at least one admin.{' '}
          {Object.values(ROLE_LABELS)
            .map((r) => `${r.name}: ${r.summary}.`)
            .join(' ')}
        </p>
      </section>
      <FormCard
        title="Invite someone"
        width="max-w-2xl"
        intro="They get a mail with a link that works once, for 7 days. It must be accepted with the same e-mail address."
      >
        <InviteForm />
      </FormCard>
      <ListCard
        title="Open invitations"
        count={invitations.length}
        emptyText="No open invitations."
      >
        <PlainTable
          head={['E-mail', 'Role', 'Invited by', 'Link', { label: 'Actions', hidden: true }]}
        >
          {invitations.map((invitation) => (
            <InvitationRow
              key={invitation.id}
              id={invitation.id}
              email={invitation.email}
              roleName={ROLE_LABELS[invitation.role].name}
              invitedBy={invitation.invitedBy}
              expiresOn={day(invitation.expiresAt)}
              expired={invitation.status === 'expired'}
            />
          ))}
        </PlainTable>
      </ListCard>
      <section className="card max-w-lg">
        <h2 className="mb-3">Organization name</h2>
        <RenameOrganizationForm currentName={ctx.organization.name} />
      </section>
    </>
  );
}
