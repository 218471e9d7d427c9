import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import {
  findInvitationByTokenHash,
  lockInvitationByTokenHash,
  markInvitation,
} from '@/db/queries/invitations';
import { findMembership, insertMembership } from '@/db/queries/organizations';
import { inTransaction, type Transaction } from '@/db/queries/transaction';
import { findUserByEmail, findUserById, insertUser } from '@/db/queries/users';
import { AppError, unauthorized } from '@/lib/app-error';
import { ROLE_LABELS, type Role } from '@/lib/auth/permissions';
import { hashToken } from '@/lib/auth/tokens';
import type { InvitationStatus } from '@/lib/contracts/team';
import { invitationClosedError, invitationStatus } from './invitation-status';

export type InvitationView = {
  id: string;
  organizationId: string;
  organizationName: string;
  email: string;
  role: Role;
  expiresAt: Date;
  status: InvitationStatus;
};

/** What the accept page shows for a token; null when no invitation has that token. */
export async function findInvitationByToken(token: string): Promise<InvitationView | null> {
  if (!token) return null;
  const row = await findInvitationByTokenHash(hashToken(token));
  if (!row) return null;
  const { acceptedAt: _acceptedAt, revokedAt: _revokedAt, ...rest } = row;
  return { ...rest, status: invitationStatus(row) };
}

type Account =
  { kind: 'new'; name: string; passwordHash: string } | { kind: 'existing'; userId: string };

/** The user who accepts: a new account for the invited address, or the signed-in member's. */
async function acceptingUser(
  tx: Transaction,
  invitation: { email: string; organizationId: string },
  account: Account,
): Promise<string> {
  if (account.kind === 'new') {
    if (await findUserByEmail(invitation.email, tx)) {
      throw new AppError(
        'account_exists',
        `An account for ${invitation.email} already exists. Sign in with it to accept the invitation.`,
      );
    }
    const userId = newId();
    // The invitation link reached this address, which confirms it.
    await insertUser(tx, {
      id: userId,
      email: invitation.email,
      name: account.name,
      passwordHash: account.passwordHash,
      emailVerifiedAt: new Date(),
    });
    return userId;
  }
  const user = await findUserById(tx, account.userId);
  if (!user) throw unauthorized();
  if (user.email !== invitation.email) {
    throw new AppError(
      'wrong_email',
      `This invitation is for ${invitation.email}, but you are signed in as ${user.email}. Sign out, then open the link again and sign in (or create the account) as ${invitation.email}.`,
    );
  }
  const already = await findMembership(user.id, invitation.organizationId, tx);
  if (already) {
    throw new AppError(
      'already_member',
      `You are already a member of this organization (${ROLE_LABELS[already.role].name}).`,
    );
  }
  return user.id;
}

/**
 * Accepts an invitation: either creates the account (signed-out person without one) or adds the
 * membership to the signed-in user whose e-mail matches. Single use: the row is locked and marked.
 */
export async function acceptInvitation(input: {
  token: string;
  account: Account;
}): Promise<{ userId: string; organizationId: string; role: Role }> {
  return inTransaction(async (tx) => {
    const invitation = await lockInvitationByTokenHash(tx, hashToken(input.token));
    if (!invitation) throw invitationClosedError('unknown');
    const status = invitationStatus(invitation);
    if (status !== 'pending') throw invitationClosedError(status);
    const userId = await acceptingUser(tx, invitation, input.account);
    await insertMembership(tx, {
      userId,
      organizationId: invitation.organizationId,
      role: invitation.role,
    });
    await markInvitation(tx, invitation.id, { acceptedAt: new Date() });
    await recordAudit(tx, {
      actorUserId: userId,
      organizationId: invitation.organizationId,
      action: 'invitation.accept',
      entityType: 'invitation',
      entityId: invitation.id,
      after: {
        email: invitation.email,
        role: invitation.role,
        userId,
        newAccount: input.account.kind === 'new',
      },
    });
    return { userId, organizationId: invitation.organizationId, role: invitation.role };
  });
}

/**
 * The invitation page: the invitation behind the link, or why it does not work; and, for a
 * signed-out visitor, whether the invited address already has an account (then: sign in first).
 */
export async function loadInvitationPage(token: string, signedIn: boolean) {
  const invitation = await findInvitationByToken(token);
  const status = invitation?.status ?? 'unknown';
  if (!invitation || status !== 'pending') {
    return {
      invitation: null,
      problem: invitationClosedError(status === 'pending' ? 'unknown' : status).message,
      accountExists: false,
    } as const;
  }
  const accountExists = !signedIn && (await findUserByEmail(invitation.email)) !== null;
  return { invitation, problem: null, accountExists } as const;
}
