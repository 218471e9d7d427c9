import 'server-only';
import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import { HttpError, notFound } from '@/lib/api/errors';
import { appUrl } from '@/lib/config';
import { enqueueMail } from '@/lib/email/queue';
import { invitationMail } from '@/lib/email/messages';
import { hashToken, INVITATION_LIFETIME_MS, newToken } from '@/lib/auth/tokens';
import { ROLE_LABELS } from '@/lib/auth/permissions';
import { getDb, type Database } from '../client';
import { invitations, memberships, organizations, users, type Role } from '../schema';
import { recordAudit } from './audit';
import { newId } from './ids';

export type InvitationStatus = 'pending' | 'accepted' | 'revoked' | 'expired';

function statusOf(row: {
  acceptedAt: Date | null;
  revokedAt: Date | null;
  expiresAt: Date;
}): InvitationStatus {
  if (row.acceptedAt) return 'accepted';
  if (row.revokedAt) return 'revoked';
  if (row.expiresAt.getTime() <= Date.now()) return 'expired';
  return 'pending';
}

const day = (date: Date) => date.toISOString().slice(0, 10);

// ---------------------------------------------------------------------------------------------
// Invitations
// ---------------------------------------------------------------------------------------------

/**
 * Creates an invitation and queues its mail, with the audit row, in one transaction. The token is
 * only in the mail; the table keeps its SHA-256.
 */
export async function createInvitation(input: {
  organizationId: string;
  email: string;
  role: Role;
  actor: { id: string; name: string };
}): Promise<{ id: string; email: string; role: Role; expiresAt: Date }> {
  return getDb().transaction(async (tx) => {
    const [organization] = await tx
      .select({ name: organizations.name })
      .from(organizations)
      .where(eq(organizations.id, input.organizationId));
    if (!organization) throw notFound('That organization');
    const member = await tx
      .select({ userId: users.id })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(
        and(eq(memberships.organizationId, input.organizationId), eq(users.email, input.email)),
      );
    if (member.length > 0) {
      throw new HttpError(
        409,
        'already_member',
        `${input.email} is already a member of this organization. Change their role in the member list instead.`,
        { email: `${input.email} is already a member.` },
      );
    }
    const open = await tx
      .select({ expiresAt: invitations.expiresAt })
      .from(invitations)
      .where(
        and(
          eq(invitations.organizationId, input.organizationId),
          eq(invitations.email, input.email),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
          gt(invitations.expiresAt, new Date()),
        ),
      );
    if (open[0]) {
      throw new HttpError(
        409,
        'already_invited',
        `An invitation to ${input.email} is still open (until ${day(open[0].expiresAt)}). Revoke it below if you want to send a new one.`,
        { email: `${input.email} already has an open invitation.` },
      );
    }
    const id = newId();
    const { token, tokenHash } = newToken();
    const expiresAt = new Date(Date.now() + INVITATION_LIFETIME_MS);
    await tx.insert(invitations).values({
      id,
      organizationId: input.organizationId,
      email: input.email,
      role: input.role,
      tokenHash,
      invitedByUserId: input.actor.id,
      expiresAt,
    });
    await recordAudit(tx, {
      actorUserId: input.actor.id,
      organizationId: input.organizationId,
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
        inviterName: input.actor.name,
        role: input.role,
        link: `${appUrl()}/invitations/accept?token=${token}`,
        expiresAt,
      }),
    });
    return { id, email: input.email, role: input.role, expiresAt };
  });
}

/** Invitations not yet accepted or revoked (open and expired), newest first. */
export async function listOpenInvitations(organizationId: string) {
  const rows = await getDb()
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
      createdAt: invitations.createdAt,
      invitedBy: users.name,
    })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedByUserId))
    .where(
      and(
        eq(invitations.organizationId, organizationId),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
      ),
    )
    .orderBy(desc(invitations.createdAt));
  return rows.map(({ acceptedAt: _a, revokedAt: _r, ...row }) => ({
    ...row,
    status: statusOf({ acceptedAt: _a, revokedAt: _r, expiresAt: row.expiresAt }),
  }));
}

export async function revokeInvitation(input: {
  organizationId: string;
  invitationId: string;
  actorUserId: string;
}): Promise<void> {
  await getDb().transaction(async (tx) => {
    const [row] = await tx
      .select()
      .from(invitations)
      .where(
        and(
          eq(invitations.id, input.invitationId),
          eq(invitations.organizationId, input.organizationId),
        ),
      )
      .for('update');
    if (!row) throw notFound('That invitation');
    if (row.acceptedAt || row.revokedAt) {
      throw new HttpError(
        409,
        'invitation_closed',
        `The invitation to ${row.email} was already ${row.acceptedAt ? 'accepted' : 'revoked'}; there is nothing to revoke.`,
      );
    }
    await tx.update(invitations).set({ revokedAt: new Date() }).where(eq(invitations.id, row.id));
    await recordAudit(tx, {
      actorUserId: input.actorUserId,
      organizationId: input.organizationId,
      action: 'invitation.revoke',
      entityType: 'invitation',
      entityId: row.id,
      before: { email: row.email, role: row.role },
    });
  });
}

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
  const [row] = await getDb()
    .select({
      id: invitations.id,
      organizationId: invitations.organizationId,
      organizationName: organizations.name,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
    })
    .from(invitations)
    .innerJoin(organizations, eq(organizations.id, invitations.organizationId))
    .where(eq(invitations.tokenHash, hashToken(token)));
  if (!row) return null;
  const { acceptedAt, revokedAt, ...rest } = row;
  return { ...rest, status: statusOf({ acceptedAt, revokedAt, expiresAt: row.expiresAt }) };
}

export function invitationClosedError(
  status: Exclude<InvitationStatus, 'pending'> | 'unknown',
): HttpError {
  switch (status) {
    case 'accepted':
      return new HttpError(
        410,
        'invitation_used',
        'This invitation was already used. Sign in, or ask an admin of the lab for a new invitation.',
      );
    case 'revoked':
      return new HttpError(
        410,
        'invitation_revoked',
        'This invitation was withdrawn by an admin of the lab. Ask them for a new one if you still need access.',
      );
    case 'expired':
      return new HttpError(
        410,
        'invitation_expired',
        'This invitation has expired (links last 7 days). Ask an admin of the lab to invite you again.',
      );
    default:
      return new HttpError(
        404,
        'invitation_not_found',
        'This invitation link is not valid. Check that you opened the whole link from the mail, or ask for a new invitation.',
      );
  }
}

/**
 * Accepts an invitation: either creates the account (signed-out person without one) or adds the
 * membership to the signed-in user whose e-mail matches. Single use: the row is locked and marked.
 */
export async function acceptInvitation(input: {
  token: string;
  account:
    { kind: 'new'; name: string; passwordHash: string } | { kind: 'existing'; userId: string };
}): Promise<{ userId: string; organizationId: string; role: Role }> {
  return getDb().transaction(async (tx) => {
    const [invitation] = await tx
      .select()
      .from(invitations)
      .where(eq(invitations.tokenHash, hashToken(input.token)))
      .for('update');
    if (!invitation) throw invitationClosedError('unknown');
    const status = statusOf(invitation);
    if (status !== 'pending') throw invitationClosedError(status);

    let userId: string;
    if (input.account.kind === 'new') {
      const existing = await tx
        .select({ id: users.id })
        .from(users)
        .where(eq(users.email, invitation.email));
      if (existing.length > 0) {
        throw new HttpError(
          409,
          'account_exists',
          `An account for ${invitation.email} already exists. Sign in with it to accept the invitation.`,
        );
      }
      userId = newId();
      // The invitation link reached this address, which confirms it.
      await tx.insert(users).values({
        id: userId,
        email: invitation.email,
        name: input.account.name,
        passwordHash: input.account.passwordHash,
        emailVerifiedAt: new Date(),
      });
    } else {
      const [user] = await tx
        .select({ id: users.id, email: users.email })
        .from(users)
        .where(eq(users.id, input.account.userId));
      if (!user)
        throw new HttpError(401, 'unauthorized', 'You are not signed in. Sign in and try again.');
      if (user.email !== invitation.email) {
        throw new HttpError(
          403,
          'wrong_email',
          `This invitation is for ${invitation.email}, but you are signed in as ${user.email}. Sign out, then open the link again and sign in (or create the account) as ${invitation.email}.`,
        );
      }
      const already = await tx
        .select({ role: memberships.role })
        .from(memberships)
        .where(
          and(
            eq(memberships.userId, user.id),
            eq(memberships.organizationId, invitation.organizationId),
          ),
        );
      if (already[0]) {
        throw new HttpError(
          409,
          'already_member',
          `You are already a member of this organization (${ROLE_LABELS[already[0].role].name}).`,
        );
      }
      userId = user.id;
    }
    await tx
      .insert(memberships)
      .values({ userId, organizationId: invitation.organizationId, role: invitation.role });
    await tx
      .update(invitations)
      .set({ acceptedAt: new Date() })
      .where(eq(invitations.id, invitation.id));
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

// ---------------------------------------------------------------------------------------------
// Members
// ---------------------------------------------------------------------------------------------

type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];

/** Locks the organization's memberships so two admins cannot demote each other at once. */
async function lockMembers(tx: Transaction, organizationId: string) {
  return tx
    .select({
      userId: memberships.userId,
      role: memberships.role,
      name: users.name,
      email: users.email,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.organizationId, organizationId))
    .for('update', { of: memberships });
}

function lastAdminError(name: string, change: string): HttpError {
  return new HttpError(
    409,
    'last_admin',
    `${name} is the only admin of this organization, so you cannot ${change}. Make another member an admin first.`,
  );
}

export async function changeMemberRole(input: {
  organizationId: string;
  userId: string;
  role: Role;
  actorUserId: string;
}): Promise<{ userId: string; role: Role }> {
  return getDb().transaction(async (tx) => {
    const members = await lockMembers(tx, input.organizationId);
    const target = members.find((m) => m.userId === input.userId);
    if (!target) throw notFound('That member');
    if (target.role === input.role) return { userId: target.userId, role: target.role };
    const admins = members.filter((m) => m.role === 'admin').length;
    if (target.role === 'admin' && admins <= 1)
      throw lastAdminError(target.name, 'change this role');
    await tx
      .update(memberships)
      .set({ role: input.role })
      .where(
        and(
          eq(memberships.userId, input.userId),
          eq(memberships.organizationId, input.organizationId),
        ),
      );
    await recordAudit(tx, {
      actorUserId: input.actorUserId,
      organizationId: input.organizationId,
      action: 'member.role_change',
      entityType: 'membership',
      entityId: input.userId,
      before: { role: target.role, email: target.email },
      after: { role: input.role, email: target.email },
    });
    return { userId: target.userId, role: input.role };
  });
}

export async function removeMember(input: {
  organizationId: string;
  userId: string;
  actorUserId: string;
}): Promise<void> {
  await getDb().transaction(async (tx) => {
    const members = await lockMembers(tx, input.organizationId);
    const target = members.find((m) => m.userId === input.userId);
    if (!target) throw notFound('That member');
    const admins = members.filter((m) => m.role === 'admin').length;
    if (target.role === 'admin' && admins <= 1) throw lastAdminError(target.name, 'remove them');
    await tx
      .delete(memberships)
      .where(
        and(
          eq(memberships.userId, input.userId),
          eq(memberships.organizationId, input.organizationId),
        ),
      );
    await recordAudit(tx, {
      actorUserId: input.actorUserId,
      organizationId: input.organizationId,
      action: 'member.remove',
      entityType: 'membership',
      entityId: input.userId,
      before: { role: target.role, email: target.email, name: target.name },
    });
  });
}
