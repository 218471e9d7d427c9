import { changeMemberRole, removeMember } from '@/db/queries/team';
import { route } from '@/lib/auth/guard';
import { roleChangeSchema } from '@/lib/validation/team';

type Params = { params: Promise<{ userId: string }> };

/** Changes a member's role. Body: { role } → { member: { userId, role } }; never the last admin. */
export const PATCH = route<Params>(
  'team:manage',
  async (request, ctx, { params }) => {
    const { userId } = await params;
    const body: unknown = await request.json().catch(() => null);
    const { role } = roleChangeSchema.parse(body ?? {});
    const member = await changeMemberRole({
      organizationId: ctx.organization.id,
      userId,
      role,
      actorUserId: ctx.user.id,
    });
    return Response.json({ member });
  },
  { what: 'change roles' },
);

/** Removes a member from the organization → { ok: true }; never the last admin. */
export const DELETE = route<Params>(
  'team:manage',
  async (_request, ctx, { params }) => {
    const { userId } = await params;
    await removeMember({ organizationId: ctx.organization.id, userId, actorUserId: ctx.user.id });
    return Response.json({ ok: true });
  },
  { what: 'remove members' },
);
