import 'server-only';
import { listUnansweredInvitations } from '@/db/queries/invitations';
import { listMembers } from '@/db/queries/organizations';
import type { OpenInvitation } from '@/lib/contracts/team';
import { invitationStatus } from './invitation-status';

export { listMembers };

/** Invitations not yet accepted or revoked (open and expired), newest first. */
export async function listOpenInvitations(organizationId: string): Promise<OpenInvitation[]> {
  const rows = await listUnansweredInvitations(organizationId);
  return rows.map(({ acceptedAt, revokedAt, ...row }) => ({
    ...row,
    status: invitationStatus({ acceptedAt, revokedAt, expiresAt: row.expiresAt }),
  }));
}

/** The team page: members and open invitations. */
export async function loadTeam(organizationId: string) {
  const [members, invitations] = await Promise.all([
    listMembers(organizationId),
    listOpenInvitations(organizationId),
  ]);
  return { members, invitations };
}
