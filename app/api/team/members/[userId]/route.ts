import { userIdParamsSchema } from '@/lib/contracts/common';
import { roleChangeSchema } from '@/lib/contracts/team';
import { json, route } from '@/server/http/route';
import { changeMemberRole, removeMember } from '@/server/team/members';

/** Changes a member's role. Body: { role } → { member: { userId, role } }; never the last admin. */
export const PATCH = route(
  {
    access: 'team:manage',
    what: 'change roles',
    params: userIdParamsSchema,
    body: roleChangeSchema,
  },
  async ({ actor, params, body }) =>
    json({ member: await changeMemberRole(actor, params.userId, body.role) }),
);

/** Removes a member from the organization → { ok: true }; never the last admin. */
export const DELETE = route(
  { access: 'team:manage', what: 'remove members', params: userIdParamsSchema },
  async ({ actor, params }) => {
    await removeMember(actor, params.userId);
    return json({ ok: true });
  },
);
