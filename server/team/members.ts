import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { deleteMembership, lockMembers, updateMemberRole } from '@/db/queries/organizations';
import { inTransaction, type Transaction } from '@/db/queries/transaction';
import { AppError, notFound } from '@/lib/app-error';
import type { Role } from '@/lib/auth/permissions';
import type { Actor } from '../actor';

/**
 * Role changes and removals. The organization's memberships are locked while a change is
 * checked, so it always keeps one admin even when two admins act at once.
 */

function lastAdminError(name: string, change: string): AppError {
  return new AppError(
    'last_admin',
    `${name} is the only admin of this organization, so you cannot ${change}. Make another member an admin first.`,
  );
}

/** The member to change, after the lock; refuses to leave the organization without an admin. */
async function lockedTarget(tx: Transaction, actor: Actor, userId: string, change: string) {
  const members = await lockMembers(tx, actor.organizationId);
  const target = members.find((m) => m.userId === userId);
  if (!target) throw notFound('That member');
  const admins = members.filter((m) => m.role === 'admin').length;
  return {
    target,
    refuseLastAdmin: () => {
      if (target.role === 'admin' && admins <= 1) throw lastAdminError(target.name, change);
    },
  };
}

export async function changeMemberRole(
  actor: Actor,
  userId: string,
  role: Role,
): Promise<{ userId: string; role: Role }> {
  return inTransaction(async (tx) => {
    const { target, refuseLastAdmin } = await lockedTarget(tx, actor, userId, 'change this role');
    if (target.role === role) return { userId, role };
    refuseLastAdmin();
    await updateMemberRole(tx, { userId, organizationId: actor.organizationId }, role);
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'member.role_change',
      entityType: 'membership',
      entityId: userId,
      before: { role: target.role, email: target.email },
      after: { role, email: target.email },
    });
    return { userId, role };
  });
}

export async function removeMember(actor: Actor, userId: string): Promise<void> {
  await inTransaction(async (tx) => {
    const { target, refuseLastAdmin } = await lockedTarget(tx, actor, userId, 'remove them');
    refuseLastAdmin();
    await deleteMembership(tx, { userId, organizationId: actor.organizationId });
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'member.remove',
      entityType: 'membership',
      entityId: userId,
      before: { role: target.role, email: target.email, name: target.name },
    });
  });
}
