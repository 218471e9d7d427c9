import 'server-only';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import { getDb } from '@/db/client';
import { sessions, users } from '@/db/schema';
import { appUrl } from '@/lib/config';

export const SESSION_COOKIE_NAME = 'beadline_session';

function createLucia() {
  const adapter = new DrizzlePostgreSQLAdapter(getDb(), sessions, users);
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(30, 'd'),
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
    }),
    getUserAttributes: (attributes) => ({ email: attributes.email, name: attributes.name }),
  });
}

const globalForLucia = globalThis as unknown as { beadlineLucia?: ReturnType<typeof createLucia> };

export function getLucia() {
  globalForLucia.beadlineLucia ??= createLucia();
  return globalForLucia.beadlineLucia;
}

declare module 'lucia' {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    DatabaseSessionAttributes: { activeOrganizationId: string | null };
    DatabaseUserAttributes: { email: string; name: string };
  }
}
