import 'server-only';
import { cookies } from 'next/headers';
import { getLucia } from './lucia';

/** Creates a session in `organizationId` and sets its cookie (server actions only). */
export async function startSession(userId: string, organizationId: string | null): Promise<void> {
  const lucia = getLucia();
  const session = await lucia.createSession(userId, { activeOrganizationId: organizationId });
  const cookie = lucia.createSessionCookie(session.id);
  (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
}
