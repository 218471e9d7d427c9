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

/**
 * A team-page form: admins only; on success a notice, and the pages that show the change
 * refreshed.
 */
function teamAction<S extends z.ZodType>(config: {
  what: string;
  input: S;
  keep?: readonly string[];
  /** '/team', or 'layout' when the change shows in the shell (roles). */
  refresh: '/team' | 'layout';
  run: (actor: Actor & { name: string }, input: z.output<S>) => Promise<unknown>;
  notice: (input: z.output<S>) => string;
  /** What the form keeps after success. */
  values?: (input: z.output<S>) => Record<string, string>;
}) {
  return formAction({
    access: 'team:manage',
    what: config.what,
    input: config.input,
    keep: config.keep,
    async run(input, { ctx }) {
      await config.run({ ...actorOf(ctx), name: ctx.user.name }, input);
      if (config.refresh === 'layout') revalidatePath('/', 'layout');
      else revalidatePath(config.refresh);
      return { notice: config.notice(input), values: config.values?.(input) };
    },
  });
}

/** Invites someone by e-mail with a role; the mail goes out through the queue. */
export const inviteMember = teamAction({
  what: 'invite people',
  input: invitationRequestSchema,
  keep: ['email', 'role'],
  refresh: '/team',
  run: invite,
  notice: ({ email }) => `Invitation sent to ${email}. The link works for 7 days.`,
  values: ({ role }) => ({ role }),
});

export const revokeInvitationAction = teamAction({
  what: 'revoke invitations',
  input: invitationIdSchema,
  refresh: '/team',
  run: (actor, { invitationId }) => revokeInvitation(actor, invitationId),
  notice: () => 'Invitation revoked.',
});

export const changeRoleAction = teamAction({
  what: 'change roles',
  input: memberRoleChangeSchema,
  refresh: 'layout',
  run: (actor, { userId, role }) => changeMemberRole(actor, userId, role),
  notice: () => 'Role saved.',
});

export const removeMemberAction = teamAction({
  what: 'remove members',
  input: memberIdSchema,
  refresh: 'layout',
  run: (actor, { userId }) => removeMember(actor, userId),
  notice: () => 'Member removed.',
});
