'use server';

import { redirect } from 'next/navigation';
import { revalidatePath } from 'next/cache';
import { organizationNameSchema, switchOrganizationSchema } from '@/lib/contracts/team';
import { actorOf } from '@/server/actor';
import { formFields, runAction, type ActionResult } from '@/server/http/action';
import { signOut as endSession } from '@/server/session/sign-out';
import { switchOrganization as switchActiveOrganization } from '@/server/session/switch-organization';
import { renameOrganization as rename } from '@/server/team/rename-organization';

/** Signs out and goes to the sign-in page (a request from elsewhere goes back to the dashboard). */
export async function signOut(): Promise<void> {
  const result = await runAction('public', ({ ctx }) => endSession(ctx));
  if (!result.ok && result.error.code !== 'bad_origin') throw new Error(result.error.message);
  redirect(result.ok ? '/sign-in' : '/dashboard');
}

/** Makes another of the user's organizations the active one for this session. */
export async function switchOrganization(formData: FormData): Promise<ActionResult> {
  const result = await runAction('signed-in', async ({ ctx }) => {
    const { organizationId } = switchOrganizationSchema.parse(formFields(formData));
    await switchActiveOrganization(ctx, organizationId);
    return undefined;
  });
  if (result.ok) revalidatePath('/', 'layout');
  return result;
}

/** Admins rename their organization (Team page). */
export async function renameOrganization(
  _previous: ActionResult | null,
  formData: FormData,
): Promise<ActionResult> {
  const result = await runAction(
    'team:manage',
    async ({ ctx }) => {
      const { name } = organizationNameSchema.parse(formFields(formData));
      await rename(actorOf(ctx), name);
      return undefined;
    },
    { what: 'rename the organization' },
  );
  if (result.ok) revalidatePath('/', 'layout');
  return result;
}
