import 'server-only';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan, type DatabaseSession, type DatabaseUser } from 'lucia';
import { getDb } from '@/db/client';
import { findSessionWithMemberships, type MembershipSummary } from '@/db/queries/organizations';
import { sessions, users } from '@/db/schema';
import { appUrl } from '@/lib/config';

export const SESSION_COOKIE_NAME = 'beadline_session';
/**
 * How long a session lives without use (each use slides it on); db/queries/sessions.ts creates
 * sessions with it too.
 */
export const SESSION_LIFETIME = new TimeSpan(7, 'd');
/** However much it is used, a session ends this long after sign-in (lib/auth/context.ts). */
export const SESSION_ABSOLUTE_LIFETIME = new TimeSpan(30, 'd');

/**
 * The Drizzle adapter, reading the session, its user and the user's memberships in one query
 * (every signed-in request needs all three; lib/auth/context.ts).
 */
class SessionAdapter extends DrizzlePostgreSQLAdapter {
  override async getSessionAndUser(
    sessionId: string,
  ): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const row = await findSessionWithMemberships(sessionId);
    if (!row) return [null, null];
    const { id, userId, expiresAt, ...session } = row.session;
    const { id: user, ...userAttributes } = row.user;
    return [
      { id, userId, expiresAt, attributes: { ...session, memberships: row.memberships } },
      { id: user, attributes: userAttributes },
    ];
  }
}

function createLucia() {
  const adapter = new SessionAdapter(getDb(), sessions, users);
  return new Lucia(adapter, {
    sessionExpiresIn: SESSION_LIFETIME,
    sessionCookie: {
      name: SESSION_COOKIE_NAME,
      attributes: {
        // Secure whenever the product is served over HTTPS (every real deployment).
        secure: appUrl().startsWith('https://'),
        sameSite: 'lax',
      },
    },
    getSessionAttributes: (attributes) => ({
      activeOrganizationId: attributes.activeOrganizationId,
      // The adapter passes the row's columns; a date column may arrive as text.
      createdAt: attributes.createdAt ? new Date(attributes.createdAt) : null,
      memberships: attributes.memberships ?? [],
    }),
    getUserAttributes: (attributes) => ({ email: attributes.email, name: attributes.name }),
  });
}

const globalForLucia = globalThis as unknown as { beadlineLucia?: ReturnType<typeof createLucia> };

/** True when a session signed in at `createdAt` has outlived SESSION_ABSOLUTE_LIFETIME. */
export function pastAbsoluteLifetime(createdAt: Date | null, now = Date.now()): boolean {
  return !!createdAt && createdAt.getTime() + SESSION_ABSOLUTE_LIFETIME.milliseconds() <= now;
}

export function getLucia() {
  globalForLucia.beadlineLucia ??= createLucia();
  return globalForLucia.beadlineLucia;
}

declare module 'lucia' {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    DatabaseSessionAttributes: {
      activeOrganizationId: string | null;
      createdAt?: Date | string;
      /** Read with the session (SessionAdapter), never written. */
      memberships?: MembershipSummary[];
    };
    DatabaseUserAttributes: { email: string; name: string };
  }
}
