'use server';

import { revalidatePath } from 'next/cache';
import {
  createInvitation,
  changeMemberRole,
  removeMember,
  revokeInvitation,
} from '@/db/queries/team';
import { runAction } from '@/lib/auth/guard';
import { invitationSchema, roleChangeSchema } from '@/lib/validation/team';
import type { FormState } from '@/components/auth/form-state';

function toFormState(
  result: Awaited<ReturnType<typeof runAction<string>>>,
  values?: Record<string, string>,
): FormState {
  if (result.ok) return { notice: result.data };
  return {
    message: result.error.fields ? undefined : result.error.message,
    fields: result.error.fields,
    code: result.error.code,
    values,
  };
}

/** Invites someone by e-mail with a role; the mail goes out through the queue. */
export async function inviteMember(_previous: FormState, formData: FormData): Promise<FormState> {
  const values = {
    email: String(formData.get('email') ?? ''),
    role: String(formData.get('role') ?? ''),
  };
  const result = await runAction(
    'team:manage',
    async (ctx) => {
      const input = invitationSchema.parse({
        email: formData.get('email'),
        role: formData.get('role'),
      });
      const invitation = await createInvitation({
        organizationId: ctx.organization.id,
        email: input.email,
        role: input.role,
        actor: { id: ctx.user.id, name: ctx.user.name },
      });
      return `Invitation sent to ${invitation.email}. The link works for 7 days.`;
    },
    { what: 'invite people' },
  );
  if (result.ok) revalidatePath('/team');
  return toFormState(result, result.ok ? { role: values.role } : values);
}

export async function revokeInvitationAction(
  _previous: FormState,
  formData: FormData,
): Promise<FormState> {
  const result = await runAction(
    'team:manage',
    async (ctx) => {
      await revokeInvitation({
        organizationId: ctx.organization.id,
        invitationId: String(formData.get('invitationId') ?? ''),
        actorUserId: ctx.user.id,
      });
      return 'Invitation revoked.';
    },
    { what: 'revoke invitations' },
  );
  if (result.ok) revalidatePath('/team');
  return toFormState(result);
}

export async function changeRoleAction(
  _previous: FormState,
  formData: FormData,
): Promise<FormState> {
  const result = await runAction(
    'team:manage',
    async (ctx) => {
      const { role } = roleChangeSchema.parse({ role: formData.get('role') });
      await changeMemberRole({
        organizationId: ctx.organization.id,
        userId: String(formData.get('userId') ?? ''),
        role,
        actorUserId: ctx.user.id,
      });
      return 'Role saved.';
    },
    { what: 'change roles' },
  );
  if (result.ok) revalidatePath('/', 'layout');
  return toFormState(result);
}

export async function removeMemberAction(
  _previous: FormState,
  formData: FormData,
): Promise<FormState> {
  const result = await runAction(
    'team:manage',
    async (ctx) => {
      await removeMember({
        organizationId: ctx.organization.id,
        userId: String(formData.get('userId') ?? ''),
        actorUserId: ctx.user.id,
      });
      return 'Member removed.';
    },
    { what: 'remove members' },
  );
  if (result.ok) revalidatePath('/', 'layout');
  return toFormState(result);
}
