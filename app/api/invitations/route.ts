import { invitationRequestSchema } from '@/lib/contracts/team';
import { json, route } from '@/server/http/route';
import { inviteMember } from '@/server/team/invite';
import { listOpenInvitations } from '@/server/team/load';

/** Open (and expired, not yet revoked) invitations of the organization → { invitations }. */
export const GET = route({ access: 'team:manage', what: 'see invitations' }, async ({ ctx }) =>
  json({ invitations: await listOpenInvitations(ctx.organization.id) }),
);

/** Invites someone by e-mail with a role. Body: { email, role } → 201 { invitation }. */
export const POST = route(
  { access: 'team:manage', what: 'invite people', body: invitationRequestSchema },
  async ({ ctx, actor, body }) =>
    json({ invitation: await inviteMember({ ...actor, name: ctx.user.name }, body) }, 201),
);
