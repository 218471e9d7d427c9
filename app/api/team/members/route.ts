import { json, route } from '@/server/http/route';
import { listMembers } from '@/server/team/load';

/** The organization's members with their roles → { members }. */
export const GET = route({ access: 'team:manage', what: 'see the member list' }, async ({ ctx }) =>
  json({ members: await listMembers(ctx.organization.id) }),
);
