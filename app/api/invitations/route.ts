import { createInvitation, listOpenInvitations } from '@/db/queries/team';
import { route } from '@/lib/auth/guard';
import { invitationSchema } from '@/lib/validation/team';

/** Open (and expired, not yet revoked) invitations of the organization → { invitations }. */
export const GET = route(
  'team:manage',
  async (_request, ctx) =>
    Response.json({ invitations: await listOpenInvitations(ctx.organization.id) }),
  { what: 'see invitations' },
);

/** Invites someone by e-mail with a role. Body: { email, role } → 201 { invitation }. */
export const POST = route(
  'team:manage',
  async (request, ctx) => {
    const body: unknown = await request.json().catch(() => null);
    const input = invitationSchema.parse(body ?? {});
    const invitation = await createInvitation({
      organizationId: ctx.organization.id,
      email: input.email,
      role: input.role,
      actor: { id: ctx.user.id, name: ctx.user.name },
    });
    return Response.json({ invitation }, { status: 201 });
  },
  { what: 'invite people' },
);
