import { route } from '@/lib/auth/guard';

/** The signed-in user, the active organization and role, and every membership. */
export const GET = route('organization:read', async (_request, ctx) =>
  Response.json({
    user: ctx.user,
    organization: ctx.organization,
    memberships: ctx.memberships,
  }),
);
