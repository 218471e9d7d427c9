import 'server-only';
import { cookies } from 'next/headers';
import { cache } from 'react';
import type { MembershipSummary } from '@/db/queries/organizations';
import { getLucia, pastAbsoluteLifetime, SESSION_COOKIE_NAME } from './lucia';
import type { Role } from './permissions';

export type AuthContext = {
  user: { id: string; email: string; name: string };
  sessionId: string;
  /** The organization the user is working in; null only for a user with no membership left. */
  organization: { id: string; name: string; role: Role } | null;
  memberships: MembershipSummary[];
};

/**
 * Who is asking, from the session cookie: the user, their memberships and the active organization.
 * Memoised per request. Refreshes the cookie when Lucia extends the session.
 */
export const getAuthContext = cache(async (): Promise<AuthContext | null> => {
  // Reading cookies first also marks every page that asks as dynamic (never prerendered).
  const cookieStore = await cookies();
  const sessionId = cookieStore.get(SESSION_COOKIE_NAME)?.value ?? null;
  if (!sessionId) return null;
  const lucia = getLucia();
  const validated = await lucia.validateSession(sessionId);
  let { session } = validated;
  const { user } = validated;
  // Sliding expiry keeps a used session alive; the absolute limit ends it all the same.
  if (session && pastAbsoluteLifetime(session.createdAt)) {
    await lucia.invalidateSession(session.id);
    session = null;
  }
  try {
    if (session?.fresh) {
      const cookie = lucia.createSessionCookie(session.id);
      cookieStore.set(cookie.name, cookie.value, cookie.attributes);
    }
    if (!session) {
      const cookie = lucia.createBlankSessionCookie();
      cookieStore.set(cookie.name, cookie.value, cookie.attributes);
    }
  } catch {
    // Server components cannot set cookies; the next action or route handler will.
  }
  if (!session || !user) return null;
  // Read with the session in one query (lib/auth/lucia.ts).
  const { memberships } = session;
  const active =
    memberships.find((m) => m.organizationId === session.activeOrganizationId) ?? memberships[0];
  return {
    user: { id: user.id, email: user.email, name: user.name },
    sessionId: session.id,
    organization: active
      ? { id: active.organizationId, name: active.organizationName, role: active.role }
      : null,
    memberships,
  };
});

export type OrgContext = AuthContext & { organization: NonNullable<AuthContext['organization']> };
