import 'server-only';
import { cookies } from 'next/headers';
import { deleteSessionWithAudit } from '@/db/queries/sessions';
import type { AuthContext } from '@/lib/auth/context';
import { getLucia } from '@/lib/auth/lucia';

/** Ends the session (with the sign-out's audit row, in one transaction) and blanks the cookie. */
export async function signOut(ctx: AuthContext | null): Promise<void> {
  if (ctx) {
    await deleteSessionWithAudit({
      sessionId: ctx.sessionId,
      userId: ctx.user.id,
      organizationId: ctx.organization?.id ?? null,
    });
  }
  const blank = getLucia().createBlankSessionCookie();
  (await cookies()).set(blank.name, blank.value, blank.attributes);
}
