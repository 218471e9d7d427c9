import { json, route } from '@/server/http/route';

/** The signed-in user, the active organization and role, and every membership. */
export const GET = route({ access: 'organization:read' }, async ({ ctx }) =>
  json({ user: ctx.user, organization: ctx.organization, memberships: ctx.memberships }),
);
