import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { inTransaction } from '@/db/queries/transaction';
import { deleteWebhook } from '@/db/queries/webhooks';
import { notFound } from '@/lib/app-error';
import type { Actor } from '../actor';

/** Deletes a webhook with its delivery log; queued deliveries of it are dropped. Audited. */
export async function removeWebhook(actor: Actor, webhookId: string): Promise<void> {
  await inTransaction(async (tx) => {
    const removed = await deleteWebhook(tx, actor.organizationId, webhookId);
    if (!removed) throw notFound('That webhook');
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'webhook.delete',
      entityType: 'webhook',
      entityId: webhookId,
      before: { url: removed.url, events: removed.events },
    });
  });
}
