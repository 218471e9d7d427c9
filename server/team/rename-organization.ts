import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { findOrganization, updateOrganizationName } from '@/db/queries/organizations';
import { inTransaction } from '@/db/queries/transaction';
import type { Actor } from '../actor';

/** Renames the actor's organization, with its audit row. */
export async function renameOrganization(
  actor: Actor,
  name: string,
): Promise<{ organization: { id: string; name: string } }> {
  await inTransaction(async (tx) => {
    const before = await findOrganization(tx, actor.organizationId);
    await updateOrganizationName(tx, actor.organizationId, name);
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'organization.update',
      entityType: 'organization',
      entityId: actor.organizationId,
      before: before ? { name: before.name } : undefined,
      after: { name },
    });
  });
  return { organization: { id: actor.organizationId, name } };
}
