import 'server-only';
import { setActiveOrganization } from '@/db/queries/organizations';
import type { AuthContext } from '@/lib/auth/context';
import { hashPassword } from '@/lib/auth/password';
import { startSession } from '@/lib/auth/session';
import { acceptInvitation } from '../team/accept-invitation';

/**
 * Accepting an invitation from its link: a signed-out person without an account gets the
 * account, the membership and a session in the organization; a signed-in member whose address
 * matches joins and works in it from now on.
 */
export async function joinWithNewAccount(input: {
  token: string;
  name: string;
  password: string;
}): Promise<void> {
  const passwordHash = await hashPassword(input.password);
  const { userId, organizationId } = await acceptInvitation({
    token: input.token,
    account: { kind: 'new', name: input.name, passwordHash },
  });
  await startSession(userId, organizationId);
}

export async function joinAsMember(ctx: AuthContext, token: string): Promise<void> {
  const { organizationId } = await acceptInvitation({
    token,
    account: { kind: 'existing', userId: ctx.user.id },
  });
  await setActiveOrganization(ctx.sessionId, organizationId);
}
