import { idParamsSchema } from '@/lib/contracts/common';
import { json, route } from '@/server/http/route';
import { revokeInvitation } from '@/server/team/revoke-invitation';

/** Revokes an open invitation; its link stops working → { ok: true }. */
export const DELETE = route(
  { access: 'team:manage', what: 'revoke invitations', params: idParamsSchema },
  async ({ actor, params }) => {
    await revokeInvitation(actor, params.id);
    return json({ ok: true });
  },
);
