import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { findOpenInvitationTo, insertInvitation } from '@/db/queries/invitations';
import { findMemberByEmail, findOrganization } from '@/db/queries/organizations';
import { inTransaction } from '@/db/queries/transaction';
import { AppError, notFound } from '@/lib/app-error';
import type { Role } from '@/lib/auth/permissions';
import { INVITATION_LIFETIME_MS, newToken } from '@/lib/auth/tokens';
import { appUrl } from '@/lib/config';
import { invitationMail } from '@/lib/email/messages';
import type { Actor } from '../actor';
import { enqueueMail } from '../mail/queue';

const day = (date: Date) => date.toISOString().slice(0, 10);

/**
 * Invites someone by e-mail with a role: the invitation, its audit row and its mail in one
 * transaction, so they exist together or not at all. The token is only in the mail; the table
 * keeps its SHA-256.
 */
export async function inviteMember(
  actor: Actor & { name: string },
  input: { email: string; role: Role },
): Promise<{ id: string; email: string; role: Role; expiresAt: Date }> {
  return inTransaction(async (tx) => {
    const organization = await findOrganization(tx, actor.organizationId);
    if (!organization) throw notFound('That organization');
    if (await findMemberByEmail(tx, actor.organizationId, input.email)) {
      throw new AppError(
        'already_member',
        `${input.email} is already a member of this organization. Change their role in the member list instead.`,
        { fields: { email: `${input.email} is already a member.` } },
      );
    }
    const open = await findOpenInvitationTo(tx, actor.organizationId, input.email);
    if (open) {
      throw new AppError(
        'already_invited',
        `An invitation to ${input.email} is still open (until ${day(open.expiresAt)}). Revoke it below if you want to send a new one.`,
        { fields: { email: `${input.email} already has an open invitation.` } },
      );
    }
    const id = newId();
    const { token, tokenHash } = newToken();
    const expiresAt = new Date(Date.now() + INVITATION_LIFETIME_MS);
    await insertInvitation(tx, {
      id,
      organizationId: actor.organizationId,
      email: input.email,
      role: input.role,
      tokenHash,
      invitedByUserId: actor.userId,
      expiresAt,
    });
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'invitation.create',
      entityType: 'invitation',
      entityId: id,
      after: { email: input.email, role: input.role, expiresAt: expiresAt.toISOString() },
    });
    await enqueueMail(tx, {
      kind: 'invitation',
      ...invitationMail({
        to: input.email,
        organizationName: organization.name,
        inviterName: actor.name,
        role: input.role,
        link: `${appUrl()}/invitations/accept?token=${token}`,
        expiresAt,
      }),
    });
    return { id, email: input.email, role: input.role, expiresAt };
  });
}
