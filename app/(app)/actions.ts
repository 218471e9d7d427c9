'use server';

import { cookies, headers } from 'next/headers';
import { redirect } from 'next/navigation';
import { revalidatePath } from 'next/cache';
import { eq } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { sessions } from '@/db/schema';
import { deleteSessionWithAudit } from '@/db/queries/sessions';
import { findMembership, renameOrganization as renameOrganizationQuery } from '@/db/queries/organizations';
import { HttpError, unauthorized } from '@/lib/api/errors';
import { getAuthContext } from '@/lib/auth/context';
import { runAction, toActionError, type ActionResult } from '@/lib/auth/guard';
import { getLucia } from '@/lib/auth/lucia';
import { isSameOrigin } from '@/lib/auth/origin';
import { organizationNameSchema, switchOrganizationSchema } from '@/lib/validation/auth';

export async function signOut(): Promise<void> {
  if (!isSameOrigin(await headers())) redirect('/dashboard');
  const ctx = await getAuthContext();
  const lucia = getLucia();
  // Ends the session and writes the sign-out's audit row in one transaction.
  if (ctx) {
    await deleteSessionWithAudit({
      sessionId: ctx.sessionId,
      userId: ctx.user.id,
      organizationId: ctx.organization?.id ?? null,
    });
  }
  const blank = lucia.createBlankSessionCookie();
  (await cookies()).set(blank.name, blank.value, blank.attributes);
  redirect('/sign-in');
}

/** Makes another of the user's organizations the active one for this session. */
export async function switchOrganization(formData: FormData): Promise<ActionResult> {
  try {
    if (!isSameOrigin(await headers())) throw new HttpError(403, 'bad_origin', 'Reload the page and try again.');
    const ctx = await getAuthContext();
    if (!ctx) throw unauthorized();
    const { organizationId } = switchOrganizationSchema.parse({
      organizationId: formData.get('organizationId'),
    });
    const membership = await findMembership(ctx.user.id, organizationId);
    if (!membership) {
      throw new HttpError(403, 'forbidden', 'You are not a member of that organization.');
    }
    await getDb()
      .update(sessions)
      .set({ activeOrganizationId: organizationId })
      .where(eq(sessions.id, ctx.sessionId));
  } catch (error) {
    return toActionError(error);
  }
  revalidatePath('/', 'layout');
  return { ok: true, data: undefined };
}

/** Admins rename their organization (Team page). */
export async function renameOrganization(
  _previous: ActionResult | null,
  formData: FormData,
): Promise<ActionResult> {
  const result = await runAction(
    'team:manage',
    async (ctx) => {
      const { name } = organizationNameSchema.parse({ name: formData.get('name') });
      await renameOrganizationQuery({
        organizationId: ctx.organization.id,
        name,
        actorUserId: ctx.user.id,
      });
      return undefined;
    },
    { what: 'rename the organization' },
  );
  if (result.ok) revalidatePath('/', 'layout');
  return result;
}
