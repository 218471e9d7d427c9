import 'server-only';
import { cookies } from 'next/headers';
import { listMembershipsOfUser } from '@/db/queries/organizations';
import { createSessionWithAudit } from '@/db/queries/sessions';
import { AppError } from '@/lib/app-error';
import { getLucia } from '@/lib/auth/lucia';
import { checkCredentials } from '@/lib/auth/sign-in';

/**
 * Signs in with e-mail and password (rate-limited by lib/auth/sign-in): the session, in the
 * user's first organization, and the sign-in's audit row are one transaction; then the cookie.
 */
export async function signIn(input: {
  email: string;
  password: string;
  ipAddress: string;
}): Promise<void> {
  const outcome = await checkCredentials(input);
  if (!outcome.ok) throw new AppError(outcome.code, outcome.message);
  const memberships = await listMembershipsOfUser(outcome.userId);
  const sessionId = await createSessionWithAudit({
    userId: outcome.userId,
    organizationId: memberships[0]?.organizationId ?? null,
    ipAddress: input.ipAddress,
  });
  const cookie = getLucia().createSessionCookie(sessionId);
  (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
}
