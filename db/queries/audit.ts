import 'server-only';
import { auditEvents } from '../schema';
import type { Database } from '../client';

export type AuditInput = {
  actorUserId: string | null;
  organizationId: string | null;
  action: string;
  entityType: string;
  entityId?: string | null;
  before?: unknown;
  after?: unknown;
};

type Executor = Pick<Database, 'insert'>;

/** Writes one audit row; call it with the transaction that makes the change. */
export async function recordAudit(tx: Executor, input: AuditInput): Promise<void> {
  await tx.insert(auditEvents).values({
    actorUserId: input.actorUserId,
    organizationId: input.organizationId,
    action: input.action,
    entityType: input.entityType,
    entityId: input.entityId ?? null,
    before: input.before ?? null,
    after: input.after ?? null,
  });
}
