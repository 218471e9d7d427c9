import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import type { Transaction } from '@/db/queries/transaction';
import type { Actor } from '../actor';

export type ChangeVerb = 'create' | 'update' | 'archive' | 'delete';

/** The audit row of one change to a lab record (`coating.update`, …), in its transaction. */
export async function auditChange(
  tx: Transaction,
  entityType: string,
  actor: Actor,
  verb: ChangeVerb,
  entityId: string,
  before: unknown,
  after: unknown,
): Promise<void> {
  await recordAudit(tx, {
    actorUserId: actor.userId,
    organizationId: actor.organizationId,
    action: `${entityType}.${verb}`,
    entityType,
    entityId,
    before,
    after,
  });
}
