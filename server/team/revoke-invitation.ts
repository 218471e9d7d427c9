import 'server-only';
import { auditAs } from '@/db/queries/audit';
import { lockInvitation, markInvitation } from '@/db/queries/invitations';
import { inTransaction } from '@/db/queries/transaction';
import { AppError, notFound } from '@/lib/app-error';
import type { Actor } from '../actor';

/** Revokes an open invitation (its link stops working), with its audit row. */
export async function revokeInvitation(actor: Actor, invitationId: string): Promise<void> {
  await inTransaction(async (tx) => {
    const row = await lockInvitation(tx, actor.organizationId, invitationId);
    if (!row) throw notFound('That invitation');
    if (row.acceptedAt || row.revokedAt) {
      throw new AppError(
        'invitation_closed',
        `The invitation to ${row.email} was already ${row.acceptedAt ? 'accepted' : 'revoked'}; there is nothing to revoke.`,
      );
    }
    await markInvitation(tx, row.id, { revokedAt: new Date() });
    await auditAs(tx, actor)('invitation.revoke', 'invitation', row.id, {
      before: { email: row.email, role: row.role },
    });
  });
}
