import { revokeInvitation } from '@/db/queries/team';
import { route } from '@/lib/auth/guard';

type Params = { params: Promise<{ id: string }> };

/** Revokes an open invitation; its link stops working → { ok: true }. */
export const DELETE = route<Params>(
  'team:manage',
  async (_request, ctx, { params }) => {
    const { id } = await params;
    await revokeInvitation({
      organizationId: ctx.organization.id,
      invitationId: id,
      actorUserId: ctx.user.id,
    });
    return Response.json({ ok: true });
  },
  { what: 'revoke invitations' },
);
