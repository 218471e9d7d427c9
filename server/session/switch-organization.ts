import 'server-only';
import { findMembership, setActiveOrganization } from '@/db/queries/organizations';
import { AppError } from '@/lib/app-error';
import type { AuthContext } from '@/lib/auth/context';

/** Makes another of the user's organizations the active one for this session. */
export async function switchOrganization(ctx: AuthContext, organizationId: string): Promise<void> {
  if (!(await findMembership(ctx.user.id, organizationId))) {
    throw new AppError('forbidden', 'You are not a member of that organization.');
  }
  await setActiveOrganization(ctx.sessionId, organizationId);
}
