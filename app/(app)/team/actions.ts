'use server';

import { revalidatePath } from 'next/cache';
import type { z } from 'zod';
import {
  invitationIdSchema,
  invitationRequestSchema,
  memberIdSchema,
  memberRoleChangeSchema,
} from '@/lib/contracts/team';
import { actorOf, type Actor } from '@/server/actor';
import { formAction } from '@/server/http/action';
import { inviteMember as invite } from '@/server/team/invite';
import { changeMemberRole, removeMember } from '@/server/team/members';
import { revokeInvitation } from '@/server/team/revoke-invitation';

/** A team-page form: admins only; on success a notice, and the pages that show it refreshed. */
function teamAction<S extends z.ZodType>(config: {
  what: string;
  input: S;
  keep?: readonly string[];
  /** '/team', or 'layout' when the change shows in the shell (roles). */
  refresh: '/team' | 'layout';
  run: (
    actor: Actor & { name: string },
    input: z.output<S>,
  ) => Promise<{ notice: string; values?: Record<string, string> }>;
}) {
  return formAction({
    access: 'team:manage',
    what: config.what,
    input: config.input,
    keep: config.keep,
    async run(input, { ctx }) {
      const state = await config.run({ ...actorOf(ctx), name: ctx.user.name }, input);
      if (config.refresh === 'layout') revalidatePath('/', 'layout');
      else revalidatePath(config.refresh);
      return state;
    },
  });
}

/** Invites someone by e-mail with a role; the mail goes out through the queue. */
export const inviteMember = teamAction({
  what: 'invite people',
  input: invitationRequestSchema,
  keep: ['email', 'role'],
  refresh: '/team',
  async run(actor, input) {
    const invitation = await invite(actor, input);
    return {
      notice: `Invitation sent to ${invitation.email}. The link works for 7 days.`,
      values: { role: input.role },
    };
  },
});

export const revokeInvitationAction = teamAction({
  what: 'revoke invitations',
  input: invitationIdSchema,
  refresh: '/team',
  async run(actor, { invitationId }) {
    await revokeInvitation(actor, invitationId);
    return { notice: 'Invitation revoked.' };
  },
});

export const changeRoleAction = teamAction({
  what: 'change roles',
  input: memberRoleChangeSchema,
  refresh: 'layout',
  async run(actor, { userId, role }) {
    await changeMemberRole(actor, userId, role);
    return { notice: 'Role saved.' };
  },
});

export const removeMemberAction = teamAction({
  what: 'remove members',
  input: memberIdSchema,
  refresh: 'layout',
  async run(actor, { userId }) {
    await removeMember(actor, userId);
    return { notice: 'Member removed.' };
  },
});
