import { listMembers } from '@/db/queries/organizations';
import { route } from '@/lib/auth/guard';

export const GET = route(
  'team:manage',
  async (_request, ctx) => Response.json({ members: await listMembers(ctx.organization.id) }),
  { what: 'see the member list' },
);
