import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { inTransaction } from '@/db/queries/transaction';
import { insertWebhook } from '@/db/queries/webhooks';
import type { WebhookCreate } from '@/lib/contracts/webhooks';
import { newWebhookSecret } from '@/lib/webhooks/signature';
import type { Actor } from '../actor';
import { checkWebhookUrl } from './check-url';

/**
 * Registers a webhook after checking its address (check-url.ts). The signing secret is answered
 * once, for the admin to copy to the receiver; the audit row names the address and events only.
 */
export async function createWebhook(
  actor: Actor,
  input: WebhookCreate,
): Promise<{ id: string; url: string; secret: string }> {
  const url = await checkWebhookUrl(input.url);
  const id = newId();
  const secret = newWebhookSecret();
  await inTransaction(async (tx) => {
    await insertWebhook(tx, {
      id,
      organizationId: actor.organizationId,
      url,
      description: input.description,
      events: input.events,
      secret,
      createdByUserId: actor.userId,
    });
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'webhook.create',
      entityType: 'webhook',
      entityId: id,
      after: { url, events: input.events, description: input.description },
    });
  });
  return { id, url, secret };
}
